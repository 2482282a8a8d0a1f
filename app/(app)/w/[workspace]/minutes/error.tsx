'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function MinutesError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Minutes" error={error} reset={reset} />;
}
