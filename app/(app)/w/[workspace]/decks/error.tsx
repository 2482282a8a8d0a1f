'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function DecksError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Decks" error={error} reset={reset} />;
}
