import { harmonicFromDos } from '@/lib/science/thermodynamics';
import type { DosBlock } from './dos-parse';
import { excerpt, MAX_REPORTED_ERRORS, type RowError } from './errors';

/** A material as a DOS import needs it. */
export interface DosMaterialFacts {
  id: string;
  atomsPerFormulaUnit: number;
  atomsInCell: number | null;
}

/** The handles a DOS file may use, by the names people write. */
export interface DosReferences {
  materials: Map<string, DosMaterialFacts>;
  sources: Map<string, string>;
  methods: Map<string, string>;
}

export interface ResolvedDosBlock {
  block: DosBlock;
  materialId: string;
  methodId: string;
  sourceId: string;
  /** 3 × atoms in the cell: what the density is renormalised to. */
  modesPerCell: number;
  /** Formula units per cell, Z = atoms in the cell / atoms per formula unit. */
  formulaUnitsPerCell: number;
}

export type DosQuantity = 'entropy' | 'heat-capacity';

/** One computed value, per mole of formula units, ready to store as a calculation. */
export interface ComputedDosValue {
  blockIndex: number;
  materialId: string;
  methodId: string;
  sourceId: string;
  quantity: DosQuantity;
  temperatureK: number;
  /** J mol⁻¹ K⁻¹ per formula unit, full precision. */
  value: number;
  /** The value as stored text: 4 decimal places. */
  valueText: string;
  unit: 'J/mol/K';
  /** Identifying fields joined, in the same shape as a typed-in calculation row's, so identical rows are recognised. */
  identity: string;
}

export const DOS_VALUE_UNIT = 'J/mol/K' as const;
export const DOS_VALUE_DECIMALS = 4;

export function formatDosValue(value: number): string {
  return value.toFixed(DOS_VALUE_DECIMALS);
}

const suggest = (handles: Iterable<string>, text: string) => {
  const lower = text.toLowerCase();
  for (const h of handles) if (h.toLowerCase() === lower) return ` Did you mean "${h}"?`;
  return '';
};

/**
 * Checks each DOS against the workspace: the material, method and source must exist,
 * and the material must have its atoms in the cell (the DOS is per cell). Problems are
 * reported once per DOS, on its first row.
 */
export function resolveDosBlocks(
  blocks: readonly DosBlock[],
  references: DosReferences,
  columnName: (key: string) => string = (k) => k,
): { resolved: ResolvedDosBlock[]; errors: RowError[]; errorCount: number } {
  const errors: RowError[] = [];
  let errorCount = 0;
  const fail = (row: number, key: string, reason: string, value: string) => {
    errorCount++;
    if (errors.length < MAX_REPORTED_ERRORS) errors.push({ row, column: columnName(key), reason, value });
  };
  const resolved: ResolvedDosBlock[] = [];
  for (const block of blocks) {
    const row = block.firstRow;
    const material = references.materials.get(block.material);
    const methodId = references.methods.get(block.method);
    const sourceId = references.sources.get(block.source);
    if (!material) fail(row, 'material', `Unknown material "${excerpt(block.material)}".${suggest(references.materials.keys(), block.material)}`, excerpt(block.material));
    else if (!material.atomsInCell || material.atomsInCell < 1) {
      fail(
        row,
        'material',
        `Material "${excerpt(block.material)}" has no atoms in the cell recorded: a DOS is per cell, so the number of modes (3 × atoms in the cell) is needed. Set it on the material's page first.`,
        block.material,
      );
    }
    if (!methodId) fail(row, 'method', `Unknown method "${excerpt(block.method)}".${suggest(references.methods.keys(), block.method)}`, excerpt(block.method));
    if (!sourceId) fail(row, 'source', `Unknown source "${excerpt(block.source)}".${suggest(references.sources.keys(), block.source)}`, excerpt(block.source));
    if (!material || !material.atomsInCell || material.atomsInCell < 1 || !methodId || !sourceId) continue;
    resolved.push({
      block,
      materialId: material.id,
      methodId,
      sourceId,
      modesPerCell: 3 * material.atomsInCell,
      formulaUnitsPerCell: material.atomsInCell / material.atomsPerFormulaUnit,
    });
  }
  return { resolved, errors, errorCount };
}

/**
 * Harmonic entropy and heat capacity of one DOS at each temperature, per mole of
 * formula units: harmonicFromDos gives them per mole of cells (the density
 * renormalised to 3 × atoms in the cell), divided here by Z, the formula units per cell.
 */
export function computeDosValues(resolved: ResolvedDosBlock, temperatures: readonly number[], blockIndex = 0): ComputedDosValue[] {
  const out: ComputedDosValue[] = [];
  const dos = { frequencyCm1: resolved.block.frequencyCm1, density: resolved.block.density };
  for (const temperatureK of temperatures) {
    const perCell = harmonicFromDos(dos, temperatureK, resolved.modesPerCell);
    const values: Array<[DosQuantity, number]> = [
      ['entropy', perCell.entropyJPerMolK / resolved.formulaUnitsPerCell],
      ['heat-capacity', perCell.heatCapacityJPerMolK / resolved.formulaUnitsPerCell],
    ];
    for (const [quantity, value] of values) {
      const valueText = formatDosValue(value);
      // Same fields and order as validateRow's identity of a calculation row.
      const identity = [
        'calculations',
        resolved.materialId,
        resolved.sourceId,
        resolved.methodId,
        quantity,
        String(Number(valueText)),
        DOS_VALUE_UNIT,
        String(temperatureK),
        '',
        '',
        '',
        '',
        '',
      ].join('\u001f');
      out.push({
        blockIndex,
        materialId: resolved.materialId,
        methodId: resolved.methodId,
        sourceId: resolved.sourceId,
        quantity,
        temperatureK,
        value,
        valueText,
        unit: DOS_VALUE_UNIT,
        identity,
      });
    }
  }
  return out;
}

/** Every value of every resolved DOS, in file order. */
export function computeAllDosValues(resolved: readonly ResolvedDosBlock[], temperatures: readonly number[]): ComputedDosValue[] {
  return resolved.flatMap((r, i) => computeDosValues(r, temperatures, i));
}
