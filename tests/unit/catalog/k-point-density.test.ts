import { describe, expect, it } from 'vitest';
import { formatGrid, kPointDensity, parseGrid } from '@/lib/catalog/k-point-density';

describe('kPointDensity', () => {
  // Definition (common practice, see shared/reference/check-values.md): k1·k2·k3 × atoms in the cell.
  it('multiplies the k-points by the atoms in the cell', () => {
    // wurtzite GaN has 4 atoms in the primitive cell: 8·8·6 · 4 = 1536
    expect(kPointDensity([8, 8, 6], 4)).toBe(1536);
    // silicon, 2 atoms: 8·8·8 · 2 = 1024
    expect(kPointDensity([8, 8, 8], 2)).toBe(1024);
  });

  it('is unknown when the grid or the cell is unknown', () => {
    expect(kPointDensity(null, 4)).toBeNull();
    expect(kPointDensity([8, 8, 8], null)).toBeNull();
    expect(kPointDensity([8, 8, 8], undefined)).toBeNull();
  });
});

describe('parseGrid', () => {
  it.each([
    ['8x8x8', [8, 8, 8]],
    ['12×12×6', [12, 12, 6]],
    ['4 4 2', [4, 4, 2]],
    [' 6X6X4 ', [6, 6, 4]],
  ])('reads %s', (text, grid) => {
    expect(parseGrid(text)).toEqual(grid);
  });

  it.each(['8x8', '8x8x8x8', '0x8x8', '8.5x8x8', 'ax8x8', ''])('refuses %s', (text) => {
    expect(parseGrid(text)).toBeNull();
  });

  it('formats a grid with multiplication signs', () => {
    expect(formatGrid([8, 8, 6])).toBe('8×8×6');
    expect(formatGrid(null)).toBe('');
  });
});
