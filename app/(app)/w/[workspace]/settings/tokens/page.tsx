import type { Metadata } from 'next';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { roleAtMost } from '@/lib/api/auth';
import { TOKEN_ROLES } from '@/db/schema/workspace';
import { listApiTokens } from '@/db/queries/tokens';
import { Panel, EmptyState } from '@/components/ui/panel';
import { CreateTokenForm } from './_components/create-token-form';
import { RevokeTokenButton } from './_components/revoke-token-button';

export const metadata: Metadata = { title: 'API tokens' };

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

export default async function TokensPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'tokens:read');
  const tokens = await listApiTokens(ctx.workspace.id);
  const canCreate = roleCan(ctx.role, 'tokens:create');
  const revokeAny = roleCan(ctx.role, 'settings:update');
  const canRevoke = roleCan(ctx.role, 'tokens:revoke');
  const roles = TOKEN_ROLES.filter((r) => roleAtMost(r, ctx.role));
  const now = new Date();

  return (
    <div className="grid gap-5 xl:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <Panel title={`API tokens (${tokens.length})`}>
        {tokens.length === 0 ? (
          <EmptyState title="No API tokens yet">Pipelines authenticate to /api/v1 with a token: Authorization: Bearer llt_…</EmptyState>
        ) : (
          <table className="w-full text-sm">
            <thead className="text-left text-xs text-ink-muted">
              <tr>
                <th className="pb-2 font-medium">Name</th>
                <th className="pb-2 font-medium">Prefix</th>
                <th className="pb-2 font-medium">Role</th>
                <th className="pb-2 font-medium">Created</th>
                <th className="pb-2 font-medium">Last used</th>
                <th className="pb-2 font-medium">Status</th>
                <th className="pb-2" />
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {tokens.map((t) => {
                const expired = t.expiresAt !== null && t.expiresAt <= now;
                const status = t.revokedAt ? 'revoked' : expired ? 'expired' : 'active';
                return (
                  <tr key={t.id} data-testid={`token-${t.prefix}`}>
                    <td className="py-2 pr-3 font-medium">{t.name}</td>
                    <td className="py-2 pr-3 font-mono text-xs">llt_{t.prefix}_…</td>
                    <td className="py-2 pr-3">{t.role}</td>
                    <td className="num py-2 pr-3 text-ink-muted">
                      {when.format(t.createdAt)} · {t.creatorName}
                    </td>
                    <td className="num py-2 pr-3 text-ink-muted">{t.lastUsedAt ? when.format(t.lastUsedAt) : 'never'}</td>
                    <td className={`py-2 pr-3 ${status === 'active' ? 'text-good' : 'text-ink-muted'}`}>
                      {status}
                      {t.expiresAt && status === 'active' && <span className="block text-xs text-ink-faint">until {when.format(t.expiresAt)}</span>}
                    </td>
                    <td className="py-2 text-right">
                      {status === 'active' && canRevoke && (revokeAny || t.createdBy === ctx.user.id) && (
                        <RevokeTokenButton workspaceId={ctx.workspace.id} tokenId={t.id} name={t.name} />
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
      </Panel>
      <div className="space-y-5">
        {canCreate ? (
          <Panel title="Create a token">
            <CreateTokenForm workspaceId={ctx.workspace.id} roles={[...roles]} />
          </Panel>
        ) : (
          <Panel title="Create a token">
            <p className="text-sm text-ink-muted">Your role ({ctx.role}) cannot create API tokens.</p>
          </Panel>
        )}
        <Panel title="Using a token">
          <div className="space-y-2 text-sm text-ink-muted">
            <p>Only a hash of each token is stored; a lost token cannot be recovered — revoke it and create another.</p>
            <pre tabIndex={0} role="region" aria-label="Example request with a token" className="overflow-x-auto rounded bg-paper p-2 font-mono text-xs text-ink">{`curl -H "Authorization: Bearer llt_…" \\
  -H "Content-Type: text/csv" \\
  --data-binary @calculations.csv \\
  "$ORIGIN/api/v1/imports?kind=calculations&fileName=calculations.csv"`}</pre>
            <p>
              The API is described at <a href="/api/v1/openapi.json">/api/v1/openapi.json</a>.
            </p>
          </div>
        </Panel>
      </div>
    </div>
  );
}
