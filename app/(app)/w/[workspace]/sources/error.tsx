'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function SourcesError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Sources" error={error} reset={reset} />;
}
