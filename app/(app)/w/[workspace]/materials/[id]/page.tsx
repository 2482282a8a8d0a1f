import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { getMaterial } from '@/db/queries/materials';
import { getMaterialValues } from '@/db/queries/material-values';
import { materialCpCorrection } from '@/lib/services/catalog/cp-correction';
import { buttonClass } from '@/components/ui/button';
import { FieldList } from '@/components/ui/field-list';
import { Panel } from '@/components/ui/panel';
import { RetractionForm } from '../../history/_components/retraction-form';
import { restoreMaterialAction, retractMaterialAction } from '../actions';
import { MaterialValuesSection } from '../_components/material-values';
import { ThermalProperties } from '../_components/thermal-properties';
import { MaterialDiscussion, loadMaterialThreads } from '../_components/material-discussion';
import { AddToDeck } from '@/app/(app)/w/[workspace]/decks/_components/add-to-deck';
import { QualityFlags } from '@/components/quality/quality-flags';
import { loadBornChargeSets, loadMaterialQuality } from '@/app/(app)/w/[workspace]/materials/_components/load-material-quality';
import { RecordDates, RetractedNotice } from '../../_components/record-pages';

export const metadata: Metadata = { title: 'Material' };

export default async function MaterialPage({ params, searchParams }: { params: Promise<{ workspace: string; id: string }>; searchParams: Promise<{ method?: string }> }) {
  const { workspace, id } = await params;
  const { method: selectedMethodId } = await searchParams;
  const ctx = await requirePageMember(workspace, 'materials:read');
  const m = await getMaterial(ctx.workspace.id, id);
  if (!m) notFound();
  const values = await getMaterialValues(ctx.workspace.id, m.id);
  const [quality, threads, born] = await Promise.all([
    loadMaterialQuality(ctx.workspace.id, m, values),
    loadMaterialThreads(ctx.workspace.id, m.id, values.methods.map((x) => x.methodId)),
    loadBornChargeSets(ctx.workspace.id, m, values),
  ]);
  const cpCorrection = materialCpCorrection(m, values.heatCapacities);
  const can = { comment: roleCan(ctx.role, 'comments:create'), resolve: roleCan(ctx.role, 'comments:resolve'), decide: roleCan(ctx.role, 'decisions:create') };
  const slug = ctx.workspace.slug;
  const fields: Array<[string, React.ReactNode]> = [
    ['Formula', m.formula],
    ['Reduced formula', m.reducedFormula],
    ['Atoms per formula unit', <span key="a" className="num">{m.atomsPerFormulaUnit}</span>],
    ['Space group', m.spaceGroup ?? '–'],
    ['Crystal system', m.crystalSystem ?? (m.spaceGroup ? '–' : 'unknown (no space group)')],
    ['Atoms in the primitive cell', m.atomsInCell != null ? <span key="c" className="num">{m.atomsInCell} ({3 * m.atomsInCell} modes at Γ)</span> : '–'],
    ['External id', m.externalId ?? '–'],
    ['Material classes', m.tags.length ? m.tags.join(', ') : '–'],
  ];
  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link href={`/w/${slug}/materials`}>← Materials</Link>
      </p>
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1>
            {m.name} {m.displayName && <span className="font-normal text-ink-muted">· {m.displayName}</span>}
          </h1>
          <RecordDates createdAt={m.createdAt} updatedAt={m.updatedAt} />
        </div>
        <div className="flex gap-2">
          {!m.retractedAt && roleCan(ctx.role, 'materials:update') && (
            <Link href={`/w/${slug}/materials/${m.id}/edit`} className={buttonClass('secondary', 'no-underline')}>
              Edit
            </Link>
          )}
          {!m.retractedAt && roleCan(ctx.role, 'measurements:create') && (
            <Link href={`/w/${slug}/measurements/new?material=${encodeURIComponent(m.name)}`} className={buttonClass('secondary', 'no-underline')}>
              Add a measurement
            </Link>
          )}
          <Link href={`/w/${slug}/history/material/${m.id}`} className={buttonClass('ghost', 'no-underline')}>
            History
          </Link>
          {!m.retractedAt && <AddToDeck workspaceId={ctx.workspace.id} kinds={['material']} filters={{ materialId: m.id, methodId: selectedMethodId }} defaultTitle={m.name} />}
        </div>
      </header>
      <RetractedNotice at={m.retractedAt} reason={m.retractionReason} />
      <Panel title="Material">
        <FieldList fields={fields} />
      </Panel>
      <ThermalProperties material={m} correction={cpCorrection} />
      <MaterialValuesSection slug={slug} materialId={m.id} materialName={m.name} values={values} born={born} selectedMethodId={selectedMethodId} />
      <MaterialDiscussion workspaceId={ctx.workspace.id} materialId={m.id} materialName={m.name} methods={values.methods} threads={threads} can={can} />
      <QualityFlags slug={slug} results={quality} thresholdsHref={`/w/${slug}/settings/quality`} />
      {roleCan(ctx.role, 'materials:retract') && (
        <Panel title={m.retractedAt ? 'Restore' : 'Retract'} className="max-w-xl">
          <RetractionForm workspaceId={ctx.workspace.id} id={m.id} mode={m.retractedAt ? 'restore' : 'retract'} action={m.retractedAt ? restoreMaterialAction : retractMaterialAction} noun="material" />
        </Panel>
      )}
    </div>
  );
}
