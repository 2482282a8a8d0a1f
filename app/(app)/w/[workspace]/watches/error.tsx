'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function WatchesError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Watches" error={error} reset={reset} />;
}
