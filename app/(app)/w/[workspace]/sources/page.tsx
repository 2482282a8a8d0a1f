import { requirePageMember } from '@/lib/session';
import { FeaturePlaceholder } from '@/components/shell/feature-placeholder';

export default async function Page({ params }: { params: Promise<{ workspace: string }> }) {
  await requirePageMember((await params).workspace, 'sources:read');
  return (
    <FeaturePlaceholder title="Sources">
      Citations behind every value: DOIs, bibliographic fields, or in-house notebook references with instrument, operator and date; BibTeX in and out.
    </FeaturePlaceholder>
  );
}
