import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { mailOutbox, watch } from '@/db/schema';
import { watchBenchmark } from '@/db/queries/watches';
import { listAlertLog } from '@/db/queries/alerts';
import { sendDueDigests } from '@/lib/services/alerts/announce';
import { whenAlertsIdle } from '@/lib/services/alerts/scheduler';
import { alertScenario, outboxTo } from './alerts-support';

let s: Awaited<ReturnType<typeof alertScenario>>;
let watchId: string;
const DAY = 86_400_000;

beforeAll(async () => {
  process.env.ALERT_DEBOUNCE_MS = '50';
  s = await alertScenario();
  ({ id: watchId } = await watchBenchmark(s.workspaceId, s.benchmarkId, s.ws.members.curator.id, 'digest'));
  for (const i of [13, 15, 16]) await s.importMode(i);
  await whenAlertsIdle();
});

describe('daily digest', () => {
  it('sends no immediate alert to a digest watcher', async () => {
    expect(await db.select().from(mailOutbox)).toHaveLength(0);
  });

  it('waits until the day is over', async () => {
    expect(await sendDueDigests(new Date())).toEqual({ digests: 0 });
    expect(await db.select().from(mailOutbox)).toHaveLength(0);
  });

  it("groups the day's revisions in one mail, compared first to last", async () => {
    const tomorrow = new Date(Date.now() + DAY);
    expect(await sendDueDigests(tomorrow)).toEqual({ digests: 1 });
    const [mail] = await outboxTo(s.ws.members.curator.email);
    const day = new Date().toISOString().slice(0, 10);
    expect(mail.kind).toBe('digest');
    expect(mail.subject).toBe(`Daily digest: Oxides <Raman> & IR (${day})`);
    expect(mail.dedupeKey).toBe(`digest:${watchId}:${day}`);
    expect(mail.textBody).toContain('3 new revisions, revision 1 → 4');
    for (const n of [2, 3, 4]) expect(mail.textBody).toMatch(new RegExp(`Revision ${n} · ${day}`));
    const first = await s.mae(1, 'X');
    const last = await s.mae(4, 'X');
    expect(mail.textBody.split('\n').find((l) => l.includes('X-PBEsol') && l.includes('→'))).toContain(`${first.mae.toFixed(2)} → ${last.mae.toFixed(2)}`);
    // revision 2 (mode 13) changed nothing beyond the thresholds; revision 3 (mode 15) moved X's MAE
    expect(mail.textBody).toMatch(/Revision 2 [^\n]*\n\s+1 measurement\(s\) and \d+ calculation\(s\) entered the scope; 0 outlier/);
    expect(mail.textBody).toMatch(/Revision 3 [^\n]*\n\s+X-PBEsol: MAE /);
    expect(mail.headers?.['List-Unsubscribe-Post']).toBe('List-Unsubscribe=One-Click');
    const [w] = await db.select().from(watch).where(eq(watch.id, watchId));
    expect(w.lastAnnouncedRevisionId).not.toBeNull();
    expect(await listAlertLog(s.workspaceId, watchId)).toHaveLength(1);
  });

  it('sends one digest per day, however often the timer runs', async () => {
    expect(await sendDueDigests(new Date(Date.now() + DAY))).toEqual({ digests: 0 });
    expect(await sendDueDigests(new Date(Date.now() + DAY + 3_600_000))).toEqual({ digests: 0 });
    expect(await db.select().from(mailOutbox)).toHaveLength(1);
  });
});
