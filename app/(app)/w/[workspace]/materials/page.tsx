import { requirePageMember } from '@/lib/session';
import { FeaturePlaceholder } from '@/components/shell/feature-placeholder';

export default async function Page({ params }: { params: Promise<{ workspace: string }> }) {
  await requirePageMember((await params).workspace, 'materials:read');
  return (
    <FeaturePlaceholder title="Materials">
      Every crystal with its formula, space group and crystal system, atoms in the primitive cell and material classes; each material page sets measured peaks beside each method&apos;s computed modes.
    </FeaturePlaceholder>
  );
}
