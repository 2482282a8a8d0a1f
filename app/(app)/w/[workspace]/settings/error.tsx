'use client';
import { FeatureError } from '@/components/ui/feature-error';

export default function SettingsError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <FeatureError area="Settings" error={error} reset={reset} />;
}
