'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function MaterialsError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Materials" error={error} reset={reset} />;
}
