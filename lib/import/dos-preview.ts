import { delimiterName } from './delimiter';
import { computeDosValues, resolveDosBlocks, type DosReferences } from './dos-compute';
import { parseDosText } from './dos-parse';
import type { RowError } from './errors';
import type { ReferenceLists } from './preview';

/** The wizard's reference lists; materials carry their atoms in the cell for DOS files. */
export type DosReferenceLists = Omit<ReferenceLists, 'materials'> & {
  materials: Array<ReferenceLists['materials'][number] & { atomsInCell?: number | null }>;
};

export function dosReferencesFrom(lists: DosReferenceLists): DosReferences {
  return {
    materials: new Map(lists.materials.map((m) => [m.name, { id: m.id, atomsPerFormulaUnit: m.atomsPerFormulaUnit, atomsInCell: m.atomsInCell ?? null }])),
    sources: new Map(lists.sources.map((s) => [s.citeKey, s.id])),
    methods: new Map(lists.methods.map((m) => [m.label, m.id])),
  };
}

export interface DosPreviewBlock {
  material: string;
  method: string;
  source: string;
  unit: string;
  firstRow: number;
  points: number;
  minFrequency: number;
  maxFrequency: number;
  /** Per temperature, J mol⁻¹ K⁻¹ per formula unit as the server will store them; absent when the DOS cannot be resolved. */
  values: Array<{ temperatureK: number; entropy: string; heatCapacity: string }> | null;
  formulaUnitsPerCell: number | null;
}

export interface DosPreviewResult {
  headers: string[];
  delimiterName: string;
  ignored: string[];
  rowCount: number;
  errorCount: number;
  errors: RowError[];
  blocks: DosPreviewBlock[];
}

/**
 * The browser's check of a DOS file: the same reader, reference checks and
 * harmonicFromDos as the server, so the preview shows the values that will be stored.
 */
export function previewDos(text: string, lists: DosReferenceLists, temperatures: readonly number[]): DosPreviewResult {
  const parsed = parseDosText(text);
  const { resolved, errors, errorCount } = resolveDosBlocks(parsed.blocks, dosReferencesFrom(lists), (key) => parsed.columnNames[key] ?? key);
  const byBlock = new Map(resolved.map((r) => [r.block, r]));
  const allErrors = [...parsed.errors, ...errors].sort((a, b) => a.row - b.row);
  const totalErrors = parsed.errorCount + errorCount;
  const blocks = parsed.blocks.map((block): DosPreviewBlock => {
    const r = byBlock.get(block);
    let values: DosPreviewBlock['values'] = null;
    if (r && totalErrors === 0) {
      const computed = computeDosValues(r, temperatures);
      values = temperatures.map((t) => ({
        temperatureK: t,
        entropy: computed.find((c) => c.temperatureK === t && c.quantity === 'entropy')!.valueText,
        heatCapacity: computed.find((c) => c.temperatureK === t && c.quantity === 'heat-capacity')!.valueText,
      }));
    }
    return {
      material: block.material,
      method: block.method,
      source: block.source,
      unit: block.unit,
      firstRow: block.firstRow,
      points: block.frequency.length,
      minFrequency: block.frequency[0] ?? NaN,
      maxFrequency: block.frequency[block.frequency.length - 1] ?? NaN,
      values,
      formulaUnitsPerCell: r ? r.formulaUnitsPerCell : null,
    };
  });
  return { headers: parsed.headers, delimiterName: delimiterName(parsed.delimiter), ignored: parsed.ignored, rowCount: parsed.rowCount, errorCount: totalErrors, errors: allErrors, blocks };
}
