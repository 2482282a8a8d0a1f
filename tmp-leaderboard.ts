import { seedDemo } from '@/db/seed';
import { db, closeDb } from '@/db/client';
import { benchmark } from '@/db/schema';
import { getRevision } from '@/db/queries/revisions';
import { eq } from 'drizzle-orm';

async function main() {
  const { workspaceId } = await seedDemo();
  const rows = await db.select({ id: benchmark.id, name: benchmark.name }).from(benchmark).where(eq(benchmark.workspaceId, workspaceId));
  for (const b of rows) {
    const r = await getRevision(workspaceId, b.id);
    if (!r) continue;
    const s = r.statistics as any;
    console.log(`\n## ${b.name} (unit ${s.unit}); common N = ${s.ranking?.commonN ?? '—'}`);
    console.log('method | N | own MAE | common MAE | coverage | rank');
    for (const m of s.methods) {
      console.log(`${m.label} | ${m.n} | ${m.statistics ? m.statistics.meanAbsoluteError.toFixed(2) : '—'} | ${m.common?.meanAbsoluteError?.toFixed(2) ?? '—'} | ${m.coverage != null ? (100 * m.coverage).toFixed(0) + ' %' : '—'} | ${m.rank ?? (m.unranked ?? '—')}`);
    }
  }
  closeDb();
}
main().catch((e) => { console.error(e); process.exit(1); });
