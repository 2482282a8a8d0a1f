import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { APPROACH_LABELS, FUNCTIONAL_SUGGESTIONS } from '@/lib/catalog/method-schema';
import { getMethod } from '@/db/queries/methods';
import { MethodForm } from '../../_components/method-form';
import { EditRecordFrame } from '../../../_components/record-pages';

export const metadata: Metadata = { title: 'Edit method' };

export default async function EditMethodPage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'methods:update');
  const m = await getMethod(ctx.workspace.id, id);
  if (!m) notFound();
  return (
    <EditRecordFrame backHref={`/w/${ctx.workspace.slug}/methods/${m.id}`} name={m.label} noun="method" retracted={Boolean(m.retractedAt)}>
      <MethodForm
        workspaceId={ctx.workspace.id}
        slug={ctx.workspace.slug}
        functionals={FUNCTIONAL_SUGGESTIONS}
        approaches={Object.entries(APPROACH_LABELS).map(([value, label]) => ({ value, label }))}
        initial={{
          id: m.id,
          label: m.label,
          functional: m.functional,
          dispersion: m.dispersion ?? '',
          pseudopotential: m.pseudopotential ?? '',
          cutoffEv: m.cutoffEv?.toString() ?? '',
          kGrid: m.kGrid ? m.kGrid.join('x') : '',
          qGrid: m.qGrid ? m.qGrid.join('x') : '',
          smearing: m.smearing ?? '',
          approach: m.approach ?? '',
          nonAnalyticCorrection: m.nonAnalyticCorrection == null ? '' : m.nonAnalyticCorrection ? 'yes' : 'no',
          notes: m.notes ?? '',
        }}
      />
    </EditRecordFrame>
  );
}
