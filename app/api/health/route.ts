import { health } from '@/lib/services/health';

export const dynamic = 'force-dynamic';

/**
 * GET /api/health — for a load balancer or a monitor: 200 when the database answers, the mail worker runs and
 * no recomputation is stuck, else 503. No session, no workspace data, and no rate limit (it is cheap: one SELECT 1).
 */
export async function GET(): Promise<Response> {
  const report = await health();
  return Response.json(report, { status: report.status === 'ok' ? 200 : 503, headers: { 'cache-control': 'no-store' } });
}
