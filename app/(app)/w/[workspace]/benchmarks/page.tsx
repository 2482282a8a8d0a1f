import { requirePageMember } from '@/lib/session';
import { FeaturePlaceholder } from '@/components/shell/feature-placeholder';

export default async function Page({ params }: { params: Promise<{ workspace: string }> }) {
  await requirePageMember((await params).workspace, 'benchmarks:read');
  return (
    <FeaturePlaceholder title="Benchmarks">
      Saved comparisons: a scope (quantity, techniques, temperature window, material classes, methods) and rules (pairing window, outlier rule). Each shows a leaderboard with N, MAE and its interval, parity and error plots, outliers with decisions, and its revision history.
    </FeaturePlaceholder>
  );
}
