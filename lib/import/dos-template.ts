import { toCsv } from '@/lib/csv';
import { DOS_COLUMNS } from './dos-format';

export const DOS_TEMPLATE_FILE_NAME = 'dos-template.csv';

/**
 * The DOS template: an invented Debye-like density (∝ ν² up to 15 THz, 0.5 THz
 * steps) for the demo material Si, only to show the format — not a computed DOS.
 */
export function dosTemplateCsv(): string {
  const rows: string[][] = [];
  for (let i = 0; i <= 30; i++) {
    const thz = i * 0.5;
    rows.push(['Si', 'PBEsol-PAW-600', 'inhouse-pbesol-2026', 'THz', thz.toFixed(1), ((thz * thz) / 75).toFixed(4)]);
  }
  return toCsv(
    DOS_COLUMNS.map((c) => c.key),
    rows,
  );
}
