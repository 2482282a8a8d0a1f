'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function MethodsError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Methods" error={error} reset={reset} />;
}
