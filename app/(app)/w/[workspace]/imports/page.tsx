import { requirePageMember } from '@/lib/session';
import { FeaturePlaceholder } from '@/components/shell/feature-placeholder';

export default async function Page({ params }: { params: Promise<{ workspace: string }> }) {
  await requirePageMember((await params).workspace, 'imports:read');
  return (
    <FeaturePlaceholder title="Imports">
      Upload batches of measurements and calculations: the template, validation with row-level errors, atomic commits, duplicates refused, and undo.
    </FeaturePlaceholder>
  );
}
