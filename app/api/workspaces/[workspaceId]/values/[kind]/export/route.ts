import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { valueListParamsSchema } from '@/lib/catalog/value-list-params';
import { listCalculationRows, listMeasurementRows } from '@/db/queries/values';
import { CALCULATION_EXPORT_HEADER, MEASUREMENT_EXPORT_HEADER, calculationCsvLine, measurementCsvLine } from '@/lib/value-export';
import { csvLine } from '@/lib/csv';

const PAGE = 1000;
const params = z.object({ workspaceId: z.string().min(1), kind: z.enum(['measurements', 'calculations']) });

/**
 * The measurements or calculations of a workspace as CSV, with the table's filters
 * (?q=&quantity=&technique=&method=&source=&import=&retracted=). Streamed page by page,
 * so a large table never sits in memory; cells that could run as formulas are neutralised.
 */
export const GET = workspaceRoute('measurements:read', params, async (request, ctx, { kind }) => {
  const query = Object.fromEntries(new URL(request.url).searchParams);
  const filters = valueListParamsSchema.parse({ ...query, page: '1', size: String(PAGE) });
  const workspaceId = ctx.workspace.id;
  const encoder = new TextEncoder();
  let page = 1;
  let headerSent = false;
  const stream = new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (!headerSent) {
        headerSent = true;
        controller.enqueue(encoder.encode(csvLine(kind === 'measurements' ? MEASUREMENT_EXPORT_HEADER : CALCULATION_EXPORT_HEADER) + '\r\n'));
        return;
      }
      const p = { ...filters, page };
      const lines =
        kind === 'measurements'
          ? (await listMeasurementRows(workspaceId, p)).rows.map(measurementCsvLine)
          : (await listCalculationRows(workspaceId, p)).rows.map(calculationCsvLine);
      if (lines.length === 0) {
        controller.close();
        return;
      }
      controller.enqueue(encoder.encode(lines.join('\r\n') + '\r\n'));
      page++;
    },
  });
  return new Response(stream, {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${ctx.workspace.slug}-${kind}.csv"`,
      'cache-control': 'private, no-store',
    },
  });
});
