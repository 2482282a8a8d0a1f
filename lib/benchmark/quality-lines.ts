/**
 * The benchmark's quality flags as lines people can read: a flag that follows from the
 * method's recipe alone (its k-point or q-point grid) says the same thing for every
 * material, so it becomes one line per method with the material count; flags about one
 * calculation (an imaginary mode, a broken acoustic sum rule, a wrong mode count) stay one
 * line per material. Lines are sorted by severity, so the real problems come first.
 */
import { counted, trueMinus } from '@/lib/format';
import type { QualityRecord } from './types';

/** Codes whose message follows from the method's grids, not from one material's modes. */
export const METHOD_LEVEL_CODES: ReadonlySet<string> = new Set(['k-point-density', 'grid-commensurability']);

/** Most serious first: a dynamical instability, a broken sum rule, a wrong mode count, then the rest; the recipe notes last. */
export const SEVERITY_ORDER: readonly string[] = [
  'imaginary-mode',
  'acoustic-sum-rule',
  'mode-count',
  'invalid-input',
  'born-charge-neutrality',
  'lyddane-sachs-teller',
  'k-point-density',
  'grid-commensurability',
];

/** Short names of the codes, for the line's lead. */
export const QUALITY_CODE_NAME: Record<string, string> = {
  'imaginary-mode': 'Imaginary mode',
  'acoustic-sum-rule': 'Acoustic sum rule',
  'mode-count': 'Mode count',
  'invalid-input': 'Unreadable modes',
  'born-charge-neutrality': 'Born charge neutrality',
  'lyddane-sachs-teller': 'Lyddane–Sachs–Teller',
  'k-point-density': 'k-point density',
  'grid-commensurability': 'q-grid / k-grid',
};

export interface QualityLine {
  /** Stable key for lists. */
  key: string;
  code: string;
  codeName: string;
  severity: 'warning' | 'error';
  methodId: string;
  methodLabel: string;
  /** One material (a per-calculation flag) or several (a method-level flag). */
  materials: string[];
  /** "on 38 materials" for a method-level line, else the material's name. */
  scope: string;
  /** The message with true minus signs; for a method-level line, the message of one material as the example. */
  message: string;
}

function rankOf(code: string): number {
  const i = SEVERITY_ORDER.indexOf(code);
  return i === -1 ? SEVERITY_ORDER.length : i;
}

/** How far a flag is from its limit, for the order inside one code: the lowest imaginary mode, the largest acoustic |ω| first. */
function magnitude(code: string, value: number | undefined): number {
  if (value === undefined) return 0;
  if (code === 'imaginary-mode') return -value;
  if (code === 'k-point-density') return -value;
  return Math.abs(value);
}

/**
 * Groups and sorts the flags of a revision. `methodLabel` and `materialName` name the ids;
 * records carry `value` (newer revisions) to order flags of one code by how bad they are.
 */
export function qualityLines(
  flags: ReadonlyArray<QualityRecord>,
  methodLabel: (id: string) => string,
  materialName: (id: string) => string,
): QualityLine[] {
  const lines: Array<QualityLine & { weight: number }> = [];
  const grouped = new Map<string, { flag: QualityRecord; materials: Set<string>; messages: Set<string>; weight: number }>();
  for (const f of flags) {
    if (METHOD_LEVEL_CODES.has(f.code)) {
      const key = `${f.methodId}|${f.code}`;
      const g = grouped.get(key) ?? { flag: f, materials: new Set<string>(), messages: new Set<string>(), weight: -Infinity };
      g.materials.add(f.materialId);
      g.messages.add(f.message);
      // the example message is the worst material's (the lowest k-point density)
      const w = magnitude(f.code, f.value);
      if (w > g.weight) {
        g.weight = w;
        g.flag = f;
      }
      grouped.set(key, g);
      continue;
    }
    lines.push({
      key: `${f.methodId}|${f.materialId}|${f.code}|${lines.length}`,
      code: f.code,
      codeName: QUALITY_CODE_NAME[f.code] ?? f.code,
      severity: f.severity,
      methodId: f.methodId,
      methodLabel: methodLabel(f.methodId),
      materials: [materialName(f.materialId)],
      scope: materialName(f.materialId),
      message: trueMinus(f.message),
      weight: magnitude(f.code, f.value),
    });
  }
  for (const [key, g] of grouped) {
    const names = [...g.materials].map(materialName).sort((a, b) => a.localeCompare(b));
    lines.push({
      key,
      code: g.flag.code,
      codeName: QUALITY_CODE_NAME[g.flag.code] ?? g.flag.code,
      severity: g.flag.severity,
      methodId: g.flag.methodId,
      methodLabel: methodLabel(g.flag.methodId),
      materials: names,
      scope: `on ${counted(names.length, 'material')}`,
      // when the message differs per material (k-point density depends on the atoms in the cell), the worst one stands for all
      message: g.messages.size > 1 ? `${trueMinus(g.flag.message)} (worst: ${materialName(g.flag.materialId)})` : trueMinus(g.flag.message),
      weight: g.weight,
    });
  }
  const severity = (s: 'warning' | 'error') => (s === 'error' ? 0 : 1);
  return lines
    .sort(
      (a, b) =>
        rankOf(a.code) - rankOf(b.code) ||
        severity(a.severity) - severity(b.severity) ||
        b.weight - a.weight ||
        a.methodLabel.localeCompare(b.methodLabel) ||
        a.scope.localeCompare(b.scope),
    )
    .map(({ weight: _weight, ...line }) => line);
}
