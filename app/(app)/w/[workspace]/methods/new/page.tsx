import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { APPROACH_LABELS, FUNCTIONAL_SUGGESTIONS } from '@/lib/catalog/method-schema';
import { MethodForm } from '../_components/method-form';

export const metadata: Metadata = { title: 'New method' };

export default async function NewMethodPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'methods:create');
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link href={`/w/${ctx.workspace.slug}/methods`}>← Methods</Link>
      </p>
      <h1>New method</h1>
      <MethodForm
        workspaceId={ctx.workspace.id}
        slug={ctx.workspace.slug}
        functionals={FUNCTIONAL_SUGGESTIONS}
        approaches={Object.entries(APPROACH_LABELS).map(([value, label]) => ({ value, label }))}
        initial={{ label: '', functional: '', dispersion: '', pseudopotential: '', cutoffEv: '', kGrid: '', qGrid: '', smearing: '', approach: '', nonAnalyticCorrection: '', notes: '' }}
      />
    </div>
  );
}
