import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { AppError } from '@/lib/errors';
import { env } from '@/lib/env';
import { minutesOf } from '@/db/queries/comments';
import { parseDateRange } from '@/lib/discussion/date-range';
import { minutesMarkdown } from '@/lib/discussion/minutes';
import { threadPath } from '@/lib/discussion/thread-url';

const params = z.object({ workspaceId: z.string().min(1) });

/** The minutes of ?from=YYYY-MM-DD&to=YYYY-MM-DD as a Markdown download. */
export const GET = workspaceRoute('comments:read', params, async (request, ctx) => {
  const url = new URL(request.url);
  const range = parseDateRange(url.searchParams.get('from'), url.searchParams.get('to'));
  if (!range.ok) throw new AppError('bad-request', range.message);
  const data = await minutesOf(ctx.workspace.id, range.from, range.to);
  const origin = env().BETTER_AUTH_URL.replace(/\/$/, '');
  const threadUrl = (t: { subjectKind: string; subjectId: string; benchmarkId: string | null }) => `${origin}${threadPath(ctx.workspace.slug, t)}`;
  const markdown = minutesMarkdown({
    workspaceName: ctx.workspace.name,
    from: range.from,
    to: new Date(range.to.getTime() - 1),
    decisions: data.decisions.map((d) => ({
      id: d.id,
      kind: d.kind,
      benchmarkName: d.benchmarkName,
      methodLabel: d.methodLabel,
      subject: d.subject,
      reason: d.reason,
      by: d.by,
      at: d.at,
      revertedAt: d.revertedAt,
      threadUrl: d.threadId && d.benchmarkId ? `${origin}/w/${ctx.workspace.slug}/benchmarks/${d.benchmarkId}#discussion` : null,
    })),
    threads: data.threads.map((t) => ({
      id: t.id,
      subject: t.subject,
      benchmarkName: t.benchmarkName,
      resolvedBy: t.resolvedByName,
      resolvedAt: t.resolvedAt!,
      url: threadUrl(t),
      comments: t.comments.map((c) => ({ author: c.authorName, at: c.createdAt, body: c.body })),
    })),
  });
  return new Response(markdown, {
    headers: {
      'content-type': 'text/markdown; charset=utf-8',
      'content-disposition': `attachment; filename="minutes-${range.fromText}-to-${range.toText}.md"`,
      'cache-control': 'private, no-store',
    },
  });
});
