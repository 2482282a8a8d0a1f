import { requirePageMember } from '@/lib/session';
import { FeaturePlaceholder } from '@/components/shell/feature-placeholder';

export default async function Page({ params }: { params: Promise<{ workspace: string }> }) {
  await requirePageMember((await params).workspace, 'decks:read');
  return (
    <FeaturePlaceholder title="Decks">
      Ordered sets of saved views for the group meeting, presented full-screen.
    </FeaturePlaceholder>
  );
}
