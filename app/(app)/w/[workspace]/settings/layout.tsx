import Link from 'next/link';

export default async function SettingsLayout({ children, params }: { children: React.ReactNode; params: Promise<{ workspace: string }> }) {
  const { workspace } = await params;
  const base = `/w/${workspace}/settings`;
  return (
    <div className="space-y-5">
      <header className="space-y-2">
        <h1>Settings</h1>
        <nav aria-label="Settings" className="flex gap-4 border-b border-rule text-sm">
          <Link href={`${base}/members`} className="-mb-px border-b-2 border-transparent pb-2 hover:border-accent">
            Members and invitations
          </Link>
          <Link href={`${base}/mail`} className="-mb-px border-b-2 border-transparent pb-2 hover:border-accent">
            Mail delivery
          </Link>
          <Link href={`${base}/webhooks`} className="-mb-px border-b-2 border-transparent pb-2 hover:border-accent">
            Webhooks
          </Link>
          <Link href={`${base}/tokens`} className="-mb-px border-b-2 border-transparent pb-2 hover:border-accent">
            API tokens
          </Link>
          <Link href={`${base}/quality`} className="-mb-px border-b-2 border-transparent pb-2 hover:border-accent">
            Quality thresholds
          </Link>
        </nav>
      </header>
      {children}
    </div>
  );
}
