import { requirePageMember } from '@/lib/session';
import { FeaturePlaceholder } from '@/components/shell/feature-placeholder';

export default async function Page({ params }: { params: Promise<{ workspace: string }> }) {
  await requirePageMember((await params).workspace, 'methods:read');
  return (
    <FeaturePlaceholder title="Methods">
      Computational recipes: functional, dispersion correction, pseudopotentials, cut-off, k- and q-grids, smearing, approach and LO–TO correction.
    </FeaturePlaceholder>
  );
}
