import { beforeAll, describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { createElement } from 'react';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { comment, commentThread, decision, mailOutbox } from '@/db/schema';
import * as discussionActions from '@/app/(app)/w/[workspace]/_discussion/actions';
import { decideFromThreadAction, postCommentAction, resolveThreadAction } from '@/app/(app)/w/[workspace]/_discussion/actions';
import { actionScope } from '@/lib/action';
import { CommentBody } from '@/components/discussion/comment-body';
import { listBenchmarkThreads } from '@/db/queries/comments';
import { getRevision } from '@/db/queries/revisions';
import { whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { GET as minutesRoute } from '@/app/api/workspaces/[workspaceId]/minutes/route';
import { requestContext } from '@/tests/support/request-context';
import { createWorkspaceWith, signInAs } from '@/tests/support/users';
import { formData } from './benchmark-support';
import { meetingBenchmark } from './meeting-support';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
let bm: Awaited<ReturnType<typeof meetingBenchmark>>;
let pairKey: string;
let threadId: string;

const handle = (email: string) => `@${email.split('@')[0]}`;

async function written() {
  return {
    threads: (await db.select().from(commentThread)).length,
    comments: (await db.select().from(comment)).length,
    mails: (await db.select().from(mailOutbox)).length,
    decisions: (await db.select().from(decision)).length,
  };
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor', 'reviewer']);
  other = await createWorkspaceWith(['curator']);
  bm = await meetingBenchmark(ws.workspaceId, ws.members.curator.email);
  pairKey = bm.revision.statistics.pairs.find((p) => p.measurementIds.length === 1)!.key;
});

describe('discussion threads', () => {
  it('a comment that mentions a member enqueues one mail to that member, in the same write', async () => {
    await signInAs(ws.members.reviewer.email);
    const before = await written();
    const state = await postCommentAction(
      undefined,
      formData({
        workspaceId: ws.workspaceId,
        subjectKind: 'pair',
        subjectId: pairKey,
        benchmarkId: bm.benchmarkId,
        body: `That Eg peak was measured on a strained film, ${handle(ws.members.contributor.email)} can you check? ${handle(ws.members.contributor.email)} again, and @nobody.here`,
      }),
    );
    expect(state.ok, state.message).toBe(true);
    expect(state.message).toBe('Comment posted; 1 member notified.');
    threadId = (state.data as { threadId: string }).threadId;
    const after = await written();
    expect(after).toEqual({ ...before, threads: before.threads + 1, comments: before.comments + 1, mails: before.mails + 1 });
    const mails = await db.select().from(mailOutbox).where(eq(mailOutbox.kind, 'mention'));
    expect(mails).toHaveLength(1);
    expect(mails[0].toAddress).toBe(ws.members.contributor.email);
    expect(mails[0].workspaceId).toBe(ws.workspaceId);
    expect(mails[0].subject).toMatch(/^reviewer mentioned you: (A (A1g|Eg)|B (A1g|T2g)) \d+ cm-1 · X-PBEsol$/);
    expect(mails[0].textBody).toContain(`http://localhost:3999/w/${ws.slug}/benchmarks/${bm.benchmarkId}#pair-${encodeURIComponent(pairKey)}`);
  });

  it('a mention of a non-member, or of oneself, sends nothing', async () => {
    const before = await written();
    const state = await postCommentAction(
      undefined,
      formData({ workspaceId: ws.workspaceId, threadId, body: `@nobody.here and ${handle(other.owner.email)} and me ${handle(ws.members.reviewer.email)}` }),
    );
    expect(state.ok, state.message).toBe(true);
    expect(state.message).toBe('Comment posted.');
    expect(await written()).toEqual({ ...before, comments: before.comments + 1 });
  });

  it('keeps HTML in a comment as text: stored verbatim, rendered escaped, links only http(s) and safe', async () => {
    const body = `<script>alert(1)</script><img src=x onerror=alert(2)> javascript:alert(3) https://doi.org/10.1000/xyz ${handle(ws.members.curator.email)}`;
    const state = await postCommentAction(undefined, formData({ workspaceId: ws.workspaceId, threadId, body }));
    expect(state.ok, state.message).toBe(true);
    const [stored] = await db.select().from(comment).where(eq(comment.id, (state.data as { commentId: string }).commentId));
    expect(stored.body).toBe(body);
    const html = renderToStaticMarkup(createElement(CommentBody, { body: stored.body }));
    expect(html).not.toMatch(/<script|<img|href="javascript/i);
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;&lt;img src=x onerror=alert(2)&gt;');
    expect(html).toContain('<a href="https://doi.org/10.1000/xyz" rel="noopener noreferrer nofollow" target="_blank">https://doi.org/10.1000/xyz</a>');
    const [mail] = await db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, ws.members.curator.email));
    expect(mail.htmlBody).not.toMatch(/<script|<img/i);
    expect(mail.htmlBody).toContain('&lt;script&gt;');
  });

  it('refuses another workspace’s subject or thread with 404 and writes nothing', async () => {
    await signInAs(other.members.curator.email);
    const before = await written();
    const tries = [
      await postCommentAction(undefined, formData({ workspaceId: other.workspaceId, threadId, body: 'hello' })),
      await postCommentAction(undefined, formData({ workspaceId: other.workspaceId, subjectKind: 'pair', subjectId: pairKey, benchmarkId: bm.benchmarkId, body: 'hello' })),
      await postCommentAction(undefined, formData({ workspaceId: other.workspaceId, subjectKind: 'material', subjectId: bm.materials.A, body: 'hello' })),
      await postCommentAction(undefined, formData({ workspaceId: ws.workspaceId, threadId, body: 'hello' })),
      await resolveThreadAction(undefined, formData({ workspaceId: other.workspaceId, threadId })),
      await decideFromThreadAction(undefined, formData({ workspaceId: other.workspaceId, threadId, kind: 'exclude-pair', reason: 'not yours' })),
    ];
    for (const t of tries) expect(t).toMatchObject({ ok: false, code: 'not-found' });
    requestContext.anonymous();
    expect(await postCommentAction(undefined, formData({ workspaceId: ws.workspaceId, threadId, body: 'hello' }))).toMatchObject({ ok: false, code: 'unauthorized' });
    expect(await written()).toEqual(before);
  });

  it('every discussion action is gated (they live outside app/, so the generic boundary test does not list them)', async () => {
    const actions = Object.entries(discussionActions) as Array<[string, (p: unknown, f: FormData) => Promise<{ ok: boolean; code?: string }>]>;
    expect(actions.map(([name]) => name).sort()).toEqual(['decideFromThreadAction', 'pinFromThreadAction', 'postCommentAction', 'resolveThreadAction']);
    const probe = (workspaceId: string) => formData({ workspaceId, threadId, subjectKind: 'pair', subjectId: pairKey, benchmarkId: bm.benchmarkId, body: 'probe', kind: 'keep', reason: 'probe' });
    for (const [name, action] of actions) {
      expect(actionScope(action), name).toBe('workspace');
      requestContext.anonymous();
      const before = await written();
      expect(await action(undefined, probe(ws.workspaceId)), name).toMatchObject({ ok: false, code: 'unauthorized' });
      await signInAs(other.owner.email);
      expect(await action(undefined, probe(ws.workspaceId)), name).toMatchObject({ ok: false, code: 'not-found' });
      expect(await written()).toEqual(before);
    }
  });

  it('a reviewer may comment but neither resolve nor decide', async () => {
    await signInAs(ws.members.reviewer.email);
    expect(await resolveThreadAction(undefined, formData({ workspaceId: ws.workspaceId, threadId }))).toMatchObject({ ok: false, code: 'forbidden' });
    expect(await decideFromThreadAction(undefined, formData({ workspaceId: ws.workspaceId, threadId, kind: 'exclude-pair', reason: 'strained film' }))).toMatchObject({
      ok: false,
      code: 'forbidden',
    });
  });

  it('a curator’s decision from the thread links to it and lowers N in the next revision', async () => {
    await signInAs(ws.members.curator.email);
    const n = (r: typeof bm.revision) => r.statistics.methods.find((m) => m.methodId === bm.methodId)!.n;
    const state = await decideFromThreadAction(undefined, formData({ workspaceId: ws.workspaceId, threadId, kind: 'exclude-pair', reason: 'strained thin film' }));
    expect(state.ok, state.message).toBe(true);
    const [row] = await db.select().from(decision).where(eq(decision.id, (state.data as { id: string }).id));
    expect(row).toMatchObject({ threadId, kind: 'exclude-pair', methodId: bm.methodId, reason: 'strained thin film', benchmarkId: bm.benchmarkId });
    await whenRecomputeIdle(ws.workspaceId, bm.benchmarkId);
    const next = (await getRevision(ws.workspaceId, bm.benchmarkId))!;
    expect(next.number).toBe(bm.revision.number + 1);
    expect(n(next)).toBe(n(bm.revision) - 1);
    expect(next.statistics.pairs.find((p) => p.key === pairKey)!.excluded).toBe('strained thin film');
    const [thread] = (await listBenchmarkThreads(ws.workspaceId, bm.benchmarkId)).filter((t) => t.id === threadId);
    expect(thread.decisions.map((d) => d.reason)).toEqual(['strained thin film']);
  });

  it('resolving closes the thread (no more replies) and the minutes list it with the decision, as Markdown', async () => {
    expect((await resolveThreadAction(undefined, formData({ workspaceId: ws.workspaceId, threadId }))).ok).toBe(true);
    expect(await postCommentAction(undefined, formData({ workspaceId: ws.workspaceId, threadId, body: 'late' }))).toMatchObject({ ok: false, code: 'conflict' });
    const today = new Date().toISOString().slice(0, 10);
    const call = (workspaceId: string, query: string) =>
      minutesRoute(new Request(`http://localhost:3999/api/workspaces/${workspaceId}/minutes?${query}`, { headers: requestContext.headers() }), { params: Promise.resolve({ workspaceId }) });
    const res = await call(ws.workspaceId, `from=${today}&to=${today}`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/markdown; charset=utf-8');
    const md = await res.text();
    expect(md).toContain('## Decisions (1)');
    expect(md).toContain('“strained thin film”');
    expect(md).toContain('## Resolved threads (1)');
    expect(md).toContain('&lt;script&gt;alert\\(1\\)&lt;/script&gt;');
    expect(md).not.toContain('<script>');

    const bad = await call(ws.workspaceId, 'from=yesterday');
    expect(bad.status).toBe(400);
    expect((await bad.json()).detail).toBe('"from" must be a date written YYYY-MM-DD, got "yesterday".');
    await signInAs(other.owner.email);
    expect((await call(ws.workspaceId, `from=${today}&to=${today}`)).status).toBe(404);
  });
});
