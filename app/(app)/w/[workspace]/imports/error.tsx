'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function ImportsError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Imports" error={error} reset={reset} />;
}
