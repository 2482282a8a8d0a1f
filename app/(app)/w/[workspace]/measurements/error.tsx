'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function MeasurementsError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Measurements" error={error} reset={reset} />;
}
