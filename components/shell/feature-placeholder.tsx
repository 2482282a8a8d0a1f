import { EmptyState } from '@/components/ui/panel';

/** The empty state of a feature area whose screens have not landed yet: says what will live there. */
export function FeaturePlaceholder({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="space-y-4">
      <h1>{title}</h1>
      <EmptyState title={`${title} will live here`}>{children}</EmptyState>
    </div>
  );
}
