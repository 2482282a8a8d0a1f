import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { listMembers } from '@/db/queries/workspaces';

/** Members of a workspace (for client-side fetching); readable by every member. */
export const GET = workspaceRoute('members:read', z.object({ workspaceId: z.string().min(1) }), async (_request, ctx) => {
  const members = await listMembers(ctx.workspace.id);
  return Response.json({ members: members.map((m) => ({ ...m, joinedAt: m.joinedAt.toISOString() })) });
});
