export type Grid = [number, number, number];

/**
 * k-point density per reciprocal atom: k1·k2·k3 × atoms in the cell
 * (the quantity high-throughput phonon work quotes, ~1000–1500 is common practice).
 * Null when either the grid or the cell is unknown.
 */
export function kPointDensity(kGrid: Grid | null | undefined, atomsInCell: number | null | undefined): number | null {
  if (!kGrid || atomsInCell == null || atomsInCell <= 0) return null;
  return kGrid[0] * kGrid[1] * kGrid[2] * atomsInCell;
}

/** "8x8x8", "8×8×8" or "8 8 8" → [8, 8, 8]; null when the text is not three positive integers. */
export function parseGrid(text: string): Grid | null {
  const parts = text.trim().split(/\s*[x×*,]\s*|\s+/i);
  if (parts.length !== 3 || !parts.every((p) => /^\d{1,3}$/.test(p))) return null;
  const grid = parts.map(Number) as Grid;
  return grid.every((n) => n > 0) ? grid : null;
}

export function formatGrid(grid: Grid | null | undefined): string {
  return grid ? grid.join('×') : '';
}
