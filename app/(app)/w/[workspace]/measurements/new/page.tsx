import type { Metadata } from 'next';
import { requirePageMember } from '@/lib/session';
import { SingleEntryPage } from '../_components/single-entry-page';

export const metadata: Metadata = { title: 'Add one measurement' };

export default async function NewMeasurementPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<{ material?: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'measurements:create');
  const { material } = await searchParams;
  return <SingleEntryPage ctx={ctx} kind="measurements" material={typeof material === 'string' ? material : undefined} />;
}
