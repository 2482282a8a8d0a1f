'use client';
import Link from 'next/link';
import { usePathname } from 'next/navigation';

const ITEMS = [
  { href: '', label: 'Overview' },
  { href: '/benchmarks', label: 'Benchmarks' },
  { href: '/materials', label: 'Materials' },
  { href: '/sources', label: 'Sources' },
  { href: '/methods', label: 'Methods' },
  { href: '/measurements', label: 'Measurements' },
  { href: '/calculations', label: 'Calculations' },
  { href: '/imports', label: 'Imports' },
  { href: '/decks', label: 'Decks' },
  { href: '/minutes', label: 'Minutes' },
  { href: '/watches', label: 'Watches' },
  { href: '/settings/members', label: 'Settings' },
];

export function WorkspaceNav({ slug }: { slug: string }) {
  const pathname = usePathname();
  const base = `/w/${slug}`;
  return (
    <nav aria-label="Workspace" className="flex flex-col gap-0.5">
      {ITEMS.map((item) => {
        const href = `${base}${item.href}`;
        const active = item.href === '' ? pathname === base : pathname.startsWith(item.href.startsWith('/settings') ? `${base}/settings` : href);
        return (
          <Link
            key={item.label}
            href={href}
            aria-current={active ? 'page' : undefined}
            className={`rounded-md px-2.5 py-1.5 text-sm no-underline ${active ? 'bg-accent-soft font-medium text-accent-strong' : 'text-ink-muted hover:bg-rule/40 hover:text-ink'}`}
          >
            {item.label}
          </Link>
        );
      })}
    </nav>
  );
}
