/**
 * CIF (Crystallographic Information File, CIF 1.1 syntax) → Cell, for common inorganic crystal structures.
 *
 * Read: the one data block that has a cell; `_cell_length_a/b/c` (Å), `_cell_angle_alpha/beta/gamma` (°);
 * the `_atom_site_` loop with `_atom_site_fract_x/y/z` and the element from `_atom_site_type_symbol`
 * (charges such as "O2-" dropped) or else `_atom_site_label` ("Ti1" → Ti); `_atom_site_occupancy`, which
 * must be 1 (partial occupancy is refused); the symmetry operations in `_space_group_symop_operation_xyz`
 * or `_symmetry_equiv_pos_as_xyz` ("-x+1/2, y, z+1/2"), applied to every site to build the full cell, with
 * positions that coincide within SAME_POSITION_TOLERANCE Å merged. A centred cell must list its centring
 * translations among the operations (as the CIF dictionary asks); the space-group symbol alone is not
 * expanded. Numbers may carry a standard uncertainty: "5.6402(3)" is read as 5.6402.
 * Without any operations the sites are taken as the full cell (P1), unless a space-group symbol other than
 * P 1 is given, which is refused (the file then holds only the asymmetric unit and no way to expand it).
 */
import { fail, MAX_STRUCTURE_ATOMS, latticeFromParameters, mergeCoincident, StructureInputError, validateCell, elementFromLabel, ambiguousElement, type Cell, type CellResult, type Vector3, SAME_POSITION_TOLERANCE } from './cell';

interface Token {
  value: string;
  line: number;
  /** Quoted or text-field values are never tags, keywords or unknowns. */
  quoted: boolean;
}

interface Item {
  value: string;
  line: number;
  unknown: boolean;
}

interface Block {
  name: string;
  line: number;
  tags: Map<string, Item>;
  loops: { tags: string[]; rows: Item[][]; line: number }[];
}

function tokenize(text: string): Token[] {
  const tokens: Token[] = [];
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i];
    if (line.startsWith(';')) {
      // A text field runs to the next line that starts with ";".
      const start = i;
      const parts = [line.slice(1)];
      i++;
      while (i < lines.length && !lines[i].startsWith(';')) parts.push(lines[i++]);
      if (i >= lines.length) fail(`Line ${start + 1}: a text field opened with ";" is never closed.`, start + 1);
      tokens.push({ value: parts.join('\n'), line: start + 1, quoted: true });
      continue;
    }
    let p = 0;
    while (p < line.length) {
      const ch = line[p];
      if (ch === ' ' || ch === '\t') {
        p++;
      } else if (ch === '#') {
        break;
      } else if (ch === "'" || ch === '"') {
        // A quote closes only when followed by white space or the end of the line (CIF 1.1).
        let q = p + 1;
        while (q < line.length && !(line[q] === ch && (q + 1 === line.length || /\s/.test(line[q + 1])))) q++;
        if (q >= line.length) fail(`Line ${i + 1}: a quoted value is not closed.`, i + 1);
        tokens.push({ value: line.slice(p + 1, q), line: i + 1, quoted: true });
        p = q + 1;
      } else {
        let q = p;
        while (q < line.length && line[q] !== ' ' && line[q] !== '\t') q++;
        tokens.push({ value: line.slice(p, q), line: i + 1, quoted: false });
        p = q;
      }
    }
  }
  return tokens;
}

const isTag = (t: Token) => !t.quoted && t.value.startsWith('_');
const isKeyword = (t: Token, word: string) => !t.quoted && t.value.toLowerCase().startsWith(word);
const item = (t: Token): Item => ({ value: t.value, line: t.line, unknown: !t.quoted && (t.value === '?' || t.value === '.') });

function parseBlocks(text: string): Block[] {
  const tokens = tokenize(text);
  const blocks: Block[] = [];
  let block: Block | null = null;
  let i = 0;
  const current = (t: Token): Block => {
    if (!block) fail(`Line ${t.line}: "${t.value}" comes before any data_ block.`, t.line);
    return block;
  };
  while (i < tokens.length) {
    const t = tokens[i];
    if (isKeyword(t, 'data_')) {
      block = { name: t.value.slice(5), line: t.line, tags: new Map(), loops: [] };
      blocks.push(block);
      i++;
    } else if (isKeyword(t, 'loop_')) {
      const b = current(t);
      const tags: string[] = [];
      i++;
      while (i < tokens.length && isTag(tokens[i])) tags.push(tokens[i++].value.toLowerCase());
      if (tags.length === 0) fail(`Line ${t.line}: loop_ has no tags.`, t.line);
      const values: Item[] = [];
      while (i < tokens.length && !isTag(tokens[i]) && !isKeyword(tokens[i], 'loop_') && !isKeyword(tokens[i], 'data_') && !isKeyword(tokens[i], 'save_')) values.push(item(tokens[i++]));
      if (values.length % tags.length !== 0) {
        fail(`Line ${t.line}: the loop of ${tags.length} columns (${tags[0]} …) holds ${values.length} values, not a whole number of rows.`, values.at(-1)?.line ?? t.line);
      }
      const rows: Item[][] = [];
      for (let r = 0; r < values.length; r += tags.length) rows.push(values.slice(r, r + tags.length));
      b.loops.push({ tags, rows, line: t.line });
    } else if (isTag(t)) {
      const b = current(t);
      const v = tokens[i + 1];
      if (!v || isTag(v) || isKeyword(v, 'loop_') || isKeyword(v, 'data_')) fail(`Line ${t.line}: ${t.value} has no value.`, t.line);
      b.tags.set(t.value.toLowerCase(), item(v));
      i += 2;
    } else if (isKeyword(t, 'save_') || isKeyword(t, 'global_') || isKeyword(t, 'stop_')) {
      i++;
    } else {
      fail(`Line ${t.line}: unexpected value "${t.value.slice(0, 40)}" outside a tag or loop.`, t.line);
    }
  }
  return blocks;
}

/** "5.6402(3)" → 5.6402; "-0.25" → −0.25; null when not a number. */
export function cifNumber(value: string): number | null {
  const match = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)(?:\(\d+\))?$/.exec(value.trim());
  return match ? Number(match[1]) : null;
}

function loopWith(block: Block, tag: string) {
  return block.loops.find((l) => l.tags.includes(tag));
}

/** A symmetry operation: f' = R f + t, R as rows. */
interface Operation {
  rotation: [Vector3, Vector3, Vector3];
  translation: Vector3;
}

/** "-x+1/2", "x-y", "+z", "0.5+y", "1/2-x" → coefficients of x, y, z and the constant term. */
function parseComponent(expr: string, op: string, line: number): { row: Vector3; shift: number } {
  const s = expr.replace(/\s+/g, '').toLowerCase();
  if (s === '') fail(`Line ${line}: symmetry operation "${op}" has an empty component.`, line);
  const row: Vector3 = [0, 0, 0];
  let shift = 0;
  const term = /([+-]?)(\d+(?:\.\d*)?(?:\/\d+(?:\.\d*)?)?|\.\d+)?(\*?)([xyz])?/y;
  let p = 0;
  while (p < s.length) {
    term.lastIndex = p;
    const m = term.exec(s);
    if (!m || m[0] === '' || (m[2] === undefined && m[4] === undefined)) fail(`Line ${line}: cannot read symmetry operation "${op}" (at "${s.slice(p)}").`, line);
    const sign = m[1] === '-' ? -1 : 1;
    let value = 1;
    if (m[2] !== undefined) {
      const [num, den] = m[2].split('/');
      value = Number(num) / (den === undefined ? 1 : Number(den));
      if (!Number.isFinite(value)) fail(`Line ${line}: cannot read symmetry operation "${op}".`, line);
    }
    if (m[4] !== undefined) row['xyz'.indexOf(m[4])] += sign * value;
    else shift += sign * value;
    p = term.lastIndex;
    if (p < s.length && s[p] !== '+' && s[p] !== '-') fail(`Line ${line}: cannot read symmetry operation "${op}" (at "${s.slice(p)}").`, line);
  }
  return { row, shift };
}

export function parseOperation(op: string, line = 0): Operation {
  const parts = op.split(',');
  if (parts.length !== 3) fail(`Line ${line}: symmetry operation "${op}" does not have three comma-separated parts.`, line);
  const comps = parts.map((part) => parseComponent(part, op, line));
  const rotation = comps.map((c) => c.row) as [Vector3, Vector3, Vector3];
  const det =
    rotation[0][0] * (rotation[1][1] * rotation[2][2] - rotation[1][2] * rotation[2][1]) -
    rotation[0][1] * (rotation[1][0] * rotation[2][2] - rotation[1][2] * rotation[2][0]) +
    rotation[0][2] * (rotation[1][0] * rotation[2][1] - rotation[1][1] * rotation[2][0]);
  if (Math.abs(Math.abs(det) - 1) > 1e-6) fail(`Line ${line}: symmetry operation "${op}" is not a rotation or reflection (determinant ${det}).`, line);
  return { rotation, translation: comps.map((c) => c.shift) as Vector3 };
}

const OPERATION_TAGS = ['_space_group_symop_operation_xyz', '_symmetry_equiv_pos_as_xyz'];
const SPACE_GROUP_TAGS = ['_space_group_name_h-m_alt', '_symmetry_space_group_name_h-m'];
/** Occupancy within this of 1 counts as full (rounding in the file). */
const OCCUPANCY_TOLERANCE = 1e-3;

/** Parses CIF text; never throws. */
export function parseCif(text: string): CellResult {
  try {
    return { ok: true, cell: readCif(text) };
  } catch (e) {
    if (e instanceof StructureInputError) return { ok: false, reason: e.message, ...(e.line ? { line: e.line } : {}) };
    throw e;
  }
}

function readCif(text: string): Cell {
  const blocks = parseBlocks(text);
  if (blocks.length === 0) fail('No data_ block: this is not a CIF file.');
  const withCell = blocks.filter((b) => b.tags.has('_cell_length_a') || loopWith(b, '_atom_site_fract_x'));
  if (withCell.length === 0) fail(`No crystal cell: the file has no _cell_length_a (data block "${blocks[0].name}").`, blocks[0].line);
  if (withCell.length > 1) fail(`The file holds ${withCell.length} structures (data blocks ${withCell.map((b) => `"${b.name}"`).join(', ')}); give one structure per file.`, withCell[1].line);
  const block = withCell[0];

  const cellTags = ['_cell_length_a', '_cell_length_b', '_cell_length_c', '_cell_angle_alpha', '_cell_angle_beta', '_cell_angle_gamma'];
  const missing = cellTags.filter((t) => !block.tags.has(t) || block.tags.get(t)!.unknown);
  if (missing.length > 0) fail(`The cell is incomplete: ${missing.join(', ')} ${missing.length === 1 ? 'is' : 'are'} missing.`, block.line);
  const params = cellTags.map((t) => {
    const it = block.tags.get(t)!;
    const v = cifNumber(it.value);
    if (v === null) fail(`Line ${it.line}: ${t} "${it.value}" is not a number.`, it.line);
    if (!(v > 0)) fail(`Line ${it.line}: ${t} must be positive, got ${it.value}.`, it.line);
    if (t.includes('angle') && !(v < 180)) fail(`Line ${it.line}: ${t} must be below 180°, got ${it.value}.`, it.line);
    return v;
  });
  const lattice = latticeFromParameters(params[0], params[1], params[2], params[3], params[4], params[5]);

  const sites = loopWith(block, '_atom_site_fract_x');
  if (!sites) {
    if (loopWith(block, '_atom_site_cartn_x')) fail('The atom sites are given in Cartesian coordinates (_atom_site_Cartn_x); only fractional coordinates (_atom_site_fract_x) are supported.');
    fail('No atom sites: the file has no _atom_site_fract_x loop.', block.line);
  }
  const col = (tag: string) => sites.tags.indexOf(tag);
  const [cx, cy, cz] = ['_atom_site_fract_x', '_atom_site_fract_y', '_atom_site_fract_z'].map(col);
  if (cy < 0 || cz < 0) fail(`Line ${sites.line}: the atom-site loop lacks _atom_site_fract_${cy < 0 ? 'y' : 'z'}.`, sites.line);
  const cType = col('_atom_site_type_symbol');
  const cLabel = col('_atom_site_label');
  const cOcc = col('_atom_site_occupancy');
  if (cType < 0 && cLabel < 0) fail(`Line ${sites.line}: the atom-site loop has neither _atom_site_type_symbol nor _atom_site_label, so the elements are unknown.`, sites.line);

  const siteSpecies: string[] = [];
  const sitePositions: Vector3[] = [];
  for (const row of sites.rows) {
    const name = cLabel >= 0 ? row[cLabel].value : row[cType].value;
    const source = cType >= 0 && !row[cType].unknown ? row[cType] : row[cLabel >= 0 ? cLabel : cType];
    const both = ambiguousElement(source.value);
    if (both) fail(`Line ${source.line}: site "${name}": "${source.value}" could be ${both[0]} or ${both[1]}; write the element in its usual case (${both[0]}… or ${both[1]}…) or give _atom_site_type_symbol.`, source.line);
    const element = elementFromLabel(source.value);
    if (!element) fail(`Line ${source.line}: site "${name}": "${source.value}" does not name a known element.`, source.line);
    if (cOcc >= 0 && !row[cOcc].unknown) {
      const occ = cifNumber(row[cOcc].value);
      if (occ === null) fail(`Line ${row[cOcc].line}: site "${name}": occupancy "${row[cOcc].value}" is not a number.`, row[cOcc].line);
      if (Math.abs(occ - 1) > OCCUPANCY_TOLERANCE) fail(`Line ${row[cOcc].line}: site "${name}" has occupancy ${row[cOcc].value}; partially occupied sites are not supported (occupancy must be 1).`, row[cOcc].line);
    }
    const xyz = [cx, cy, cz].map((c, k) => {
      const it = row[c];
      const v = it.unknown ? null : cifNumber(it.value);
      if (v === null) fail(`Line ${it.line}: site "${name}": fractional ${'xyz'[k]} "${it.value}" is not a number.`, it.line);
      return v;
    }) as Vector3;
    siteSpecies.push(element);
    sitePositions.push(xyz);
  }

  if (sitePositions.length > MAX_STRUCTURE_ATOMS) fail(`The file lists ${sitePositions.length.toLocaleString('en')} atom sites; at most ${MAX_STRUCTURE_ATOMS.toLocaleString('en')} atoms are accepted.`, sites.line);
  const operations = readOperations(block);
  if (operations.length > 192 * 8) fail(`The file lists ${operations.length} symmetry operations; a space group has at most 192 in its conventional cell.`);
  const allF: Vector3[] = [];
  const allS: string[] = [];
  for (let s = 0; s < sitePositions.length; s++) {
    const f = sitePositions[s];
    for (const op of operations) {
      allF.push(op.rotation.map((r, i) => r[0] * f[0] + r[1] * f[1] + r[2] * f[2] + op.translation[i]) as Vector3);
      allS.push(siteSpecies[s]);
    }
  }
  // Degenerate lattices must be refused before merging (the tolerance grid needs an inverse).
  validateCell({ lattice, fractional: sitePositions, species: siteSpecies });
  const merged = mergeCoincident(lattice, allF, allS, SAME_POSITION_TOLERANCE);
  const cell: Cell = { lattice, fractional: merged.fractional, species: merged.species };
  validateCell(cell);
  return cell;
}

function readOperations(block: Block): Operation[] {
  for (const tag of OPERATION_TAGS) {
    const loop = loopWith(block, tag);
    if (loop) {
      const c = loop.tags.indexOf(tag);
      return loop.rows.map((row) => parseOperation(row[c].value, row[c].line));
    }
    const single = block.tags.get(tag);
    if (single) return [parseOperation(single.value, single.line)];
  }
  const symbolItem = SPACE_GROUP_TAGS.map((t) => block.tags.get(t)).find((it) => it && !it.unknown);
  if (symbolItem && symbolItem.value.replace(/\s+/g, '').toUpperCase() !== 'P1') {
    fail(`Line ${symbolItem.line}: space group "${symbolItem.value}" is named but no symmetry operations are listed (_space_group_symop_operation_xyz or _symmetry_equiv_pos_as_xyz), so the full cell cannot be built.`, symbolItem.line);
  }
  return [parseOperation('x,y,z')];
}
