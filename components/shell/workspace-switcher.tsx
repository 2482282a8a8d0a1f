'use client';
import { useRouter } from 'next/navigation';

export function WorkspaceSwitcher({ current, workspaces }: { current: string; workspaces: Array<{ slug: string; name: string }> }) {
  const router = useRouter();
  return (
    <label className="block">
      <span className="sr-only">Switch workspace</span>
      <select
        value={current}
        onChange={(e) => router.push(e.target.value === '__all' ? '/w' : `/w/${e.target.value}`)}
        className="w-full rounded-md border border-rule-strong bg-panel px-2 py-1.5 text-sm font-medium"
      >
        {workspaces.map((w) => (
          <option key={w.slug} value={w.slug}>
            {w.name}
          </option>
        ))}
        <option value="__all">All workspaces / new…</option>
      </select>
    </label>
  );
}
