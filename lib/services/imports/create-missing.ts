import 'server-only';
import { AppError } from '@/lib/errors';
import { roleCan, type WorkspaceRole } from '@/lib/permissions';

/** createMissing creates materials and methods: the caller's role (or token's) must be allowed to create both. */
export function assertCreateMissingPermissions(role: WorkspaceRole): void {
  const lacking = (['materials:create', 'methods:create'] as const).filter((p) => !roleCan(role, p));
  if (lacking.length) throw new AppError('forbidden', `createMissing needs the permission${lacking.length === 1 ? '' : 's'} ${lacking.join(' and ')}, which this role lacks.`);
}
