import type { Metadata } from 'next';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { getQualitySettings } from '@/db/queries/settings';
import { Panel } from '@/components/ui/panel';
import { THRESHOLD_FIELDS } from './fields';
import { QualityThresholdsForm } from './_components/quality-thresholds-form';

export const metadata: Metadata = { title: 'Quality thresholds' };

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

export default async function QualityThresholdsPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'settings:read');
  const settings = await getQualitySettings(ctx.workspace.id);
  const canEdit = roleCan(ctx.role, 'settings:update');
  return (
    <div className="grid gap-5 xl:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <Panel title="Quality thresholds">
        {canEdit ? (
          <QualityThresholdsForm workspaceId={ctx.workspace.id} fields={THRESHOLD_FIELDS} current={settings.thresholds} />
        ) : (
          <table className="w-full text-sm">
            <caption className="sr-only">Quality thresholds</caption>
            <thead className="text-left text-xs text-ink-muted">
              <tr>
                <th className="pb-2 font-medium">Threshold</th>
                <th className="pb-2 text-right font-medium">Value</th>
                <th className="pb-2 text-right font-medium">Default</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {THRESHOLD_FIELDS.map((f) => (
                <tr key={f.key}>
                  <td className="py-2 pr-3">
                    {f.label} <span className="text-ink-muted">({f.unit})</span>
                    <span className="block text-xs text-ink-faint">{f.explanation}</span>
                  </td>
                  <td className="num py-2 pr-3 text-right">{settings.thresholds[f.key]}</td>
                  <td className="num py-2 text-right text-ink-muted">{f.defaultValue}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        <p className="mt-3 text-xs text-ink-faint">
          {settings.updatedAt ? `Last changed ${when.format(settings.updatedAt)}${settings.updatedByName ? ` by ${settings.updatedByName}` : ''}.` : 'The defaults have never been changed.'}
          {!canEdit && ` Your role (${ctx.role}) can read these; curators and owners change them.`}
        </p>
      </Panel>
      <Panel title="Where they are used">
        <div className="space-y-2 text-sm text-ink-muted">
          <p>
            Every calculation set — one method’s modes of one material — is checked against these thresholds. The flags appear on the material page per method and in each
            benchmark’s quality table.
          </p>
          <p>
            A k-point density needs the method’s k-grid and the material’s atoms in the primitive cell; grid commensurability needs the k- and q-grids. A check whose inputs are
            missing is skipped, not failed.
          </p>
          <p>Saving new thresholds recomputes the workspace’s benchmarks: their next revision records the thresholds it used.</p>
        </div>
      </Panel>
    </div>
  );
}
