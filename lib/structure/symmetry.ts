/**
 * Space group and primitive cell of a crystal, through moyo (the successor of spglib), compiled to
 * WebAssembly and published as @spglib/moyo-wasm. Server side only: it reads the .wasm file from disk.
 *
 * The package is built for the web (wasm-bindgen `--target web`): its default loader fetches the .wasm
 * beside its own URL, which Node's fetch cannot do for file: URLs. So the bytes are read here and handed to
 * `initSync`. In Next.js the package is listed in `serverExternalPackages` (next.config.mjs), so it is
 * loaded from node_modules at run time and not bundled (the dynamic import below); the .wasm file is read
 * from beside the package's main file.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import type { Cell } from '@/lib/science/structure';
import { atomicNumber } from '@/lib/science/structure';

/**
 * Distance tolerance (Å) for "the same position after a symmetry operation": 0.01 Å.
 * Structure files carry coordinates to 4–6 decimals (a rounding of 0.3333 for 1/3 in a 5 Å cell is
 * 1.7·10⁻⁴ Å), and relaxed DFT cells break symmetry by 10⁻⁴–10⁻³ Å; 0.01 Å sits well above both and well
 * below real distortions (0.05 Å and more). It is the default of pymatgen's SpacegroupAnalyzer — from memory.
 * A looser tolerance finds a higher group in a slightly distorted cell; see tests/unit/structure/derive.test.ts.
 */
export const DEFAULT_SYMPREC = 0.01;

/**
 * Largest cell (atoms) given to the symmetry search. moyo's time grows steeply with the number of pure
 * translations (supercells): measured here (2 shared cores, Node 20) on rock-salt NaCl supercells, 64 atoms
 * 0.2 s (with loading), 216 atoms 0.5 s, 512 atoms 7 s — and the search blocks the server thread meanwhile.
 */
export const MAX_SYMMETRY_ATOMS = 250;

export type SymmetryResult =
  | { ok: true; spaceGroup: number; hmSymbol: string; hallNumber: number; atomsInPrimitiveCell: number; symprec: number }
  | { ok: false; reason: string };

interface MoyoModule {
  initSync(module: { module: BufferSource }): unknown;
  analyze_cell(
    cellJson: string,
    symprec: number,
    setting: string,
  ): {
    number: number;
    hall_number: number;
    hm_symbol: string;
    prim_std_cell: { numbers: number[] };
  };
}

const PACKAGE = '@spglib/moyo-wasm';
const WASM_FILE = 'moyo_wasm_bg.wasm';

let loading: Promise<MoyoModule | null> | null = null;
let loadError: string | null = null;

/**
 * Where moyo_wasm_bg.wasm lies: beside the package's main file, found by Node's resolver from the app root
 * (process.cwd(), where `npm run start`, `next` and vitest run). Two things a bundler must not see: a request
 * for the .wasm itself (Turbopack would compile it into the bundle and fail), and `createRequire(import.meta.url)`
 * (Turbopack replaces its `resolve()` with a module id). A resolver made from a run-time path is left alone.
 */
function wasmPath(): string {
  const main = createRequire(path.join(process.cwd(), 'package.json')).resolve(PACKAGE);
  return path.join(path.dirname(main), WASM_FILE);
}

async function loadMoyo(): Promise<MoyoModule | null> {
  loading ??= (async () => {
    try {
      const moyo = (await import('@spglib/moyo-wasm')) as unknown as MoyoModule;
      moyo.initSync({ module: readFileSync(wasmPath()) });
      return moyo;
    } catch (e) {
      loadError = e instanceof Error ? e.message : String(e);
      return null;
    }
  })();
  return loading;
}

/** Why the symmetry library could not be loaded, or null when it loaded (or was not tried yet). */
export function symmetryUnavailableReason(): string | null {
  return loadError;
}

/**
 * Space group (ITA number 1–230, Hermann–Mauguin symbol) and the number of atoms in the primitive cell,
 * at distance tolerance `symprec` (Å). Returns null when the WebAssembly module cannot be loaded in this
 * environment (the reason is in symmetryUnavailableReason()); `{ ok: false }` when moyo refuses the cell.
 */
export async function findSymmetry(cell: Cell, symprec: number = DEFAULT_SYMPREC): Promise<SymmetryResult | null> {
  if (!(symprec > 0)) throw new Error(`symprec must be a positive distance in Å, got ${symprec}`);
  if (cell.species.length > MAX_SYMMETRY_ATOMS) {
    return { ok: false, reason: `The cell has ${cell.species.length} atoms; the space group is searched for cells of at most ${MAX_SYMMETRY_ATOMS} atoms (give the primitive or conventional cell).` };
  }
  const moyo = await loadMoyo();
  if (!moyo) return null;
  const input = {
    lattice: { basis: cell.lattice.flat() },
    positions: cell.fractional,
    numbers: cell.species.map(atomicNumber),
  };
  try {
    const data = moyo.analyze_cell(JSON.stringify(input), symprec, 'Standard');
    if (!Number.isInteger(data.number) || data.number < 1 || data.number > 230) {
      return { ok: false, reason: `The symmetry search returned space group ${data.number}, outside 1–230.` };
    }
    return { ok: true, spaceGroup: data.number, hmSymbol: data.hm_symbol, hallNumber: data.hall_number, atomsInPrimitiveCell: data.prim_std_cell.numbers.length, symprec };
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    return { ok: false, reason: `The symmetry search failed for this cell (tolerance ${symprec} Å): ${message}` };
  }
}
