import { buttonClass } from '@/components/ui/button';

/** Downloads the rows the table's filters select (all pages), as CSV with the numbers as entered. */
export function ExportCsvLink({ workspaceId, kind, searchParams }: { workspaceId: string; kind: 'measurements' | 'calculations'; searchParams: Record<string, string | string[] | undefined> }) {
  const query = new URLSearchParams();
  for (const [k, v] of Object.entries(searchParams)) {
    const value = Array.isArray(v) ? v[0] : v;
    if (value !== undefined && k !== 'page' && k !== 'size') query.set(k, value);
  }
  return (
    <a className={buttonClass('secondary')} href={`/api/workspaces/${workspaceId}/values/${kind}/export?${query}`} download>
      Export CSV
    </a>
  );
}
