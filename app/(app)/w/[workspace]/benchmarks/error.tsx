'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function BenchmarksError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Benchmarks" error={error} reset={reset} />;
}
