import 'server-only';
import { AppError } from '@/lib/errors';
import { isWorkspaceRole, roleCan, type Permission, type WorkspaceRole } from '@/lib/permissions';
import { findLiveTokenByHash, touchApiToken } from '@/db/queries/tokens';
import { hashApiToken, TOKEN_PATTERN } from './tokens';

export interface TokenContext {
  workspaceId: string;
  /** The token's role, never more than its creator's current role. */
  role: WorkspaceRole;
  tokenId: string;
  createdBy: string;
}

const RANK: Record<WorkspaceRole, number> = { reviewer: 0, contributor: 1, curator: 2, owner: 3 };

/** Last use is written at most once a minute per token, so reads do not queue behind writes. */
const TOUCH_INTERVAL_MS = 60_000;

/**
 * Resolves `Authorization: Bearer llt_…` to the token's workspace and role.
 * Unknown, malformed, revoked or expired tokens, and tokens whose creator has
 * left the workspace, are all 401. The permission is then checked (403).
 */
export async function authenticateToken(request: Request, permission: Permission): Promise<TokenContext> {
  const header = request.headers.get('authorization') ?? '';
  const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
  if (!match) throw new AppError('unauthorized', 'Send an API token: Authorization: Bearer llt_…');
  const token = match[1];
  if (!TOKEN_PATTERN.test(token)) throw new AppError('unauthorized', 'Malformed API token.');
  const found = await findLiveTokenByHash(hashApiToken(token));
  const now = new Date();
  if (!found) throw new AppError('unauthorized', 'Unknown or revoked API token.');
  if (found.expiresAt && found.expiresAt <= now) throw new AppError('unauthorized', 'This API token has expired.');
  if (!found.creatorRole || !isWorkspaceRole(found.creatorRole)) throw new AppError('unauthorized', "The token's creator is no longer a member of its workspace.");
  const role: WorkspaceRole = RANK[found.creatorRole] < RANK[found.role] ? found.creatorRole : found.role;
  if (!found.lastUsedAt || now.getTime() - found.lastUsedAt.getTime() > TOUCH_INTERVAL_MS) await touchApiToken(found.id, now);
  if (!roleCan(role, permission)) throw new AppError('forbidden', `This token's role (${role}) does not allow ${permission.replace(':', ' → ')}.`);
  return { workspaceId: found.workspaceId, role, tokenId: found.id, createdBy: found.createdBy };
}

/** Whether `granted` is at most `holder` (a token never outranks its creator). */
export function roleAtMost(granted: WorkspaceRole, holder: WorkspaceRole): boolean {
  return RANK[granted] <= RANK[holder];
}
