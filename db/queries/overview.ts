import 'server-only';
import { and, count, eq, isNull } from 'drizzle-orm';
import { db } from '@/db/client';
import { calculation, material, measurement, member, method, source } from '@/db/schema';

/** Headline counts of one workspace (live rows only). */
export async function workspaceOverview(workspaceId: string) {
  const live = <T extends typeof material | typeof source | typeof method | typeof measurement | typeof calculation>(t: T) =>
    db.select({ n: count() }).from(t).where(and(eq(t.workspaceId, workspaceId), isNull(t.retractedAt)));
  const [m, s, me, ms, c, mb] = await Promise.all([
    live(material),
    live(source),
    live(method),
    live(measurement),
    live(calculation),
    db.select({ n: count() }).from(member).where(eq(member.organizationId, workspaceId)),
  ]);
  return { materials: m[0].n, sources: s[0].n, methods: me[0].n, measurements: ms[0].n, calculations: c[0].n, members: mb[0].n };
}
