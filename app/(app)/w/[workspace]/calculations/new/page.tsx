import type { Metadata } from 'next';
import { requirePageMember } from '@/lib/session';
import { SingleEntryPage } from '../../measurements/_components/single-entry-page';

export const metadata: Metadata = { title: 'Add one calculation' };

export default async function NewCalculationPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<{ material?: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'calculations:create');
  const { material } = await searchParams;
  return <SingleEntryPage ctx={ctx} kind="calculations" material={typeof material === 'string' ? material : undefined} />;
}
