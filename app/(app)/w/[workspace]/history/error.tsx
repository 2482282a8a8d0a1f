'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function HistoryError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="History" error={error} reset={reset} />;
}
