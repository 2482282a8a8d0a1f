import { AppError } from '@/lib/errors';
import { EXPORT_FORMAT_NAMES, EXPORT_FORMATS, exportSources, type ExportFormat } from './export';
import type { SourceRecord } from './record';

/** ?format=bibtex|ris|csl-json (absent: BibTeX). */
export function exportFormatParam(request: Request): ExportFormat {
  const raw = new URL(request.url).searchParams.get('format') ?? 'bibtex';
  if (!(EXPORT_FORMAT_NAMES as string[]).includes(raw)) throw new AppError('bad-request', `Query parameter "format" must be one of ${EXPORT_FORMAT_NAMES.join(', ')}, got "${raw}".`);
  return raw as ExportFormat;
}

/** A reference file as a download named `${baseName}.${extension}`. */
export function referenceFileResponse(sources: readonly SourceRecord[], format: ExportFormat, baseName: string, empty?: string): Response {
  const body = exportSources(sources, format);
  const spec = EXPORT_FORMATS[format];
  return new Response(body || (format === 'bibtex' && empty ? `% ${empty}\n` : body), {
    headers: {
      'content-type': spec.contentType,
      'content-disposition': `attachment; filename="${baseName}.${spec.extension}"`,
      'cache-control': 'private, no-store',
    },
  });
}
