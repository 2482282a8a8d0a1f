'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function CalculationsError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Calculations" error={error} reset={reset} />;
}
