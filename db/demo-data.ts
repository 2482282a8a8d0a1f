/**
 * Loads the invented demo scenario of data/demo/ into a workspace: sources,
 * materials, methods, measurements (published values where a real source is
 * named, invented ones otherwise) and synthetic calculations generated per
 * method from its bias and noise (seeded, so every seed run gives the same numbers).
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import Papa from 'papaparse';
import { and, eq } from 'drizzle-orm';
import { z } from 'zod';
import { crystalSystem, createRandom, normalizeIrrep, parseFormula } from '@/lib/science';
import type { Executor } from '@/db/client';
import { calculation, material, materialTag, measurement, method, source } from '@/db/schema';
import { writeAudit } from '@/db/queries/audit';
import { normaliseSourceRow } from '@/lib/catalog/source-schema';
import { storedSource } from '@/lib/citations/stored';

const dataDir = new URL('../data/demo/', import.meta.url);

function readCsv<T extends z.ZodType>(file: string, schema: T): Array<z.infer<T>> {
  const text = readFileSync(fileURLToPath(new URL(file, dataDir)), 'utf8');
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
  if (parsed.errors.length) throw new Error(`${file}: ${parsed.errors[0].message} (row ${parsed.errors[0].row})`);
  return parsed.data.map((row, i) => {
    const r = schema.safeParse(row);
    if (!r.success) throw new Error(`${file} row ${i + 2}: ${r.error.issues.map((x) => `${x.path.join('.')}: ${x.message}`).join('; ')}`);
    return r.data;
  });
}

const optionalNumber = z.string().transform((v, ctx) => {
  if (v.trim() === '') return null;
  const n = Number(v);
  if (!Number.isFinite(n)) ctx.addIssue({ code: 'custom', message: `not a number: ${v}` });
  return n;
});

/** A row of sources.csv, checked and normalised like any source (authors "Family, G.; …", braces for an organisation). */
const sourceRow = z
  .object({
    cite_key: z.string().min(1),
    kind: z.string(),
    doi: z.string(),
    title: z.string(),
    authors: z.string(),
    year: z.string(),
    venue: z.string(),
    volume: z.string(),
    issue: z.string(),
    pages: z.string(),
    publisher: z.string(),
    notebook_ref: z.string(),
    invented: z.enum(['yes', 'no']),
    note: z.string(),
  })
  .transform((r, ctx) => {
    const checked = normaliseSourceRow({ ...r, citeKey: r.cite_key, notebookRef: r.notebook_ref });
    if (!checked.ok) {
      for (const issue of checked.issues) ctx.addIssue({ code: 'custom', path: [issue.field], message: issue.message });
      return z.NEVER;
    }
    if (checked.review.length) ctx.addIssue({ code: 'custom', path: ['authors'], message: `names the parser cannot split: ${checked.review.join('; ')}` });
    return checked.source;
  });
const materialRow = z.object({
  name: z.string().min(1),
  display_name: z.string(),
  formula: z.string().min(1),
  space_group: optionalNumber,
  atoms_in_cell: optionalNumber,
  tags: z.string(),
  // the Cp − Cv fields, filled for a few crystals only (data/demo/README.md, "Heat capacities")
  thermal_expansion_per_K: optionalNumber,
  bulk_modulus_GPa: optionalNumber,
  molar_volume_cm3: optionalNumber,
});
const THERMAL_COLUMNS = ['thermal_expansion_per_K', 'bulk_modulus_GPa', 'molar_volume_cm3'];
const modeRow = z.object({
  material: z.string(),
  irrep: z.string(),
  branch: z.enum(['', 'TO', 'LO']),
  activity: z.enum(['raman', 'ir', 'raman+ir', 'silent']),
  degeneracy: optionalNumber,
  measured_cm1: z.string(),
  uncertainty_cm1: z.string(),
  temperature_K: optionalNumber,
  technique: z.enum(['', 'raman', 'ir-reflectance', 'ir-absorption', 'ins', 'hyper-raman']),
  source: z.string(),
  reference_cm1: optionalNumber,
  notes: z.string().default(''),
});
const entropyRow = z.object({
  material: z.string(),
  entropy_J_per_mol_K: z.string().min(1),
  uncertainty: z.string(),
  temperature_K: optionalNumber,
  source: z.string(),
});
const heatCapacityRow = z.object({
  material: z.string(),
  heat_capacity_J_per_mol_K: z.string().min(1),
  temperature_K: z.coerce.number().positive(),
  source: z.string(),
});
const dielectricRow = z.object({
  material: z.string(),
  eps_inf: z.string().min(1),
  modelled_on: z.string(),
  source: z.string(),
});
const bornRow = z.object({
  material: z.string(),
  cation: z.string(),
  anion: z.string(),
  z_e: z.string().min(1),
  modelled_on: z.string(),
  source: z.string(),
});
const BORN_NOTE = 'Invented Born effective charge (demo): a magnitude recalled from memory moved by a few per cent; not a measurement.';
const DIELECTRIC_NOTE = 'Invented ε∞ (demo): a textbook value moved by 5–6 %; not a measurement.';
const HEAT_CAPACITY_NOTE = 'Cp° recalled from memory of the NIST-JANAF tables, not checked against them (demo data).';
const methodsFile = z.object({
  seed: z.number().int(),
  methods: z.array(
    z.object({
      label: z.string(),
      functional: z.string(),
      pseudopotential: z.string(),
      cutoffEv: z.number(),
      kGrid: z.tuple([z.number(), z.number(), z.number()]),
      qGrid: z.tuple([z.number(), z.number(), z.number()]),
      smearing: z.string(),
      approach: z.enum(['perturbation', 'finite-displacement']),
      nonAnalyticCorrection: z.boolean(),
      frequencyBias: z.number(),
      frequencyNoise: z.number(),
      entropyBias: z.number(),
      entropyNoise: z.number(),
      heatCapacityBias: z.number(),
      heatCapacityNoise: z.number(),
      epsInfBias: z.number(),
      epsInfNoise: z.number(),
      bornBias: z.number().default(0),
      bornNoise: z.number().default(0.02),
      overrides: z
        .array(z.object({ material: z.string(), irrep: z.string(), branch: z.string().optional(), nth: z.number().int(), valueCm1: z.number().optional(), scale: z.number().optional() }))
        .default([]),
      acousticOverrides: z.array(z.object({ material: z.string(), valueCm1: z.number() })).default([]),
    }),
  ),
});

/** The identity of a value row, to detect rows identical to existing ones. */
export function demoRowHash(fields: Array<string | number | null | undefined>): string {
  return createHash('sha256').update(JSON.stringify(fields)).digest('hex');
}

function gaussian(random: () => number): number {
  const u = Math.max(random(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

const round = (value: number, digits: number) => Number(value.toFixed(digits));

/**
 * The demo scenario in a workspace; `convergenceFamily` adds the invented k-point family of data/demo/convergence.json
 * (the seed puts it in a workspace of its own, so the main demo's "every method" benchmarks stay as they are).
 */
export async function loadDemoScenario(tx: Executor, workspaceId: string, userId: string, options: { convergenceFamily?: boolean } = {}): Promise<{ created: boolean }> {
  const existing = await tx.select({ id: material.id }).from(material).where(and(eq(material.workspaceId, workspaceId), eq(material.name, 'Si'))).limit(1);
  if (existing[0]) return { created: false };

  const actor = { userId };
  const sources = readCsv('sources.csv', sourceRow);
  const materials = readCsv('materials.csv', materialRow);
  const modes = readCsv('modes.csv', modeRow);
  const entropies = readCsv('entropies.csv', entropyRow);
  const heatCapacities = readCsv('heat-capacities.csv', heatCapacityRow);
  const dielectric = readCsv('dielectric.csv', dielectricRow);
  const born = readCsv('born-charges.csv', bornRow);
  const methodsSpec = methodsFile.parse(JSON.parse(readFileSync(fileURLToPath(new URL('methods.json', dataDir)), 'utf8')));

  const sourceIds = new Map<string, string>();
  for (const s of sources) {
    const fields = storedSource(s);
    const [row] = await tx
      .insert(source)
      .values({ workspaceId, ...fields, createdBy: userId })
      .returning({ id: source.id });
    sourceIds.set(s.citeKey, row.id);
    await writeAudit({ workspaceId, actor, action: 'create', entityType: 'source', entityId: row.id, after: fields, reason: 'demo seed' }, tx);
  }

  const materialIds = new Map<string, { id: string; atomsPerFormulaUnit: number }>();
  for (const m of materials) {
    const parsed = parseFormula(m.formula);
    const [row] = await tx
      .insert(material)
      .values({
        workspaceId,
        name: m.name,
        displayName: m.display_name || null,
        formula: m.formula,
        reducedFormula: parsed.reduced,
        atomsPerFormulaUnit: parsed.atomsPerFormulaUnit,
        elementCounts: parsed.counts,
        spaceGroup: m.space_group,
        crystalSystem: m.space_group ? crystalSystem(m.space_group) : null,
        atomsInCell: m.atoms_in_cell,
        thermalExpansionPerK: m.thermal_expansion_per_K,
        bulkModulusGpa: m.bulk_modulus_GPa,
        molarVolumeCm3: m.molar_volume_cm3,
        createdBy: userId,
      })
      .returning({ id: material.id });
    materialIds.set(m.name, { id: row.id, atomsPerFormulaUnit: parsed.atomsPerFormulaUnit });
    const tags = m.tags.split(';').map((t) => t.trim()).filter(Boolean);
    if (tags.length) await tx.insert(materialTag).values(tags.map((tag) => ({ materialId: row.id, workspaceId, tag })));
    // the audit entry lists the thermal cells only where a row fills them
    const after = Object.fromEntries(Object.entries(m).filter(([k, v]) => v !== null || !THERMAL_COLUMNS.includes(k)));
    await writeAudit({ workspaceId, actor, action: 'create', entityType: 'material', entityId: row.id, after, reason: 'demo seed' }, tx);
  }

  const need = <K, V>(map: Map<K, V>, key: K, what: string): V => {
    const v = map.get(key);
    if (v === undefined) throw new Error(`demo data: unknown ${what} ${String(key)}`);
    return v;
  };

  // Measurements: every mode row with a measured value, and the entropies.
  for (const m of modes) {
    if (!m.measured_cm1) continue;
    const mat = need(materialIds, m.material, 'material');
    const value = Number(m.measured_cm1);
    await tx.insert(measurement).values({
      workspaceId,
      materialId: mat.id,
      sourceId: need(sourceIds, m.source, 'source'),
      quantity: 'frequency',
      value,
      valueText: m.measured_cm1,
      unit: 'cm-1',
      uncertainty: m.uncertainty_cm1 ? Number(m.uncertainty_cm1) : null,
      uncertaintyText: m.uncertainty_cm1 || null,
      temperatureK: m.temperature_K,
      irrep: m.branch ? `${m.irrep}(${m.branch})` : m.irrep,
      irrepNormalized: normalizeIrrep(m.branch ? `${m.irrep}(${m.branch})` : m.irrep),
      branch: m.branch || null,
      activity: m.activity,
      technique: m.technique || null,
      sampleForm: 'single-crystal',
      notes: m.notes || null,
      rowHash: demoRowHash(['measurement', m.material, 'frequency', m.measured_cm1, 'cm-1', m.irrep, m.branch, m.temperature_K, m.source]),
      contributorId: userId,
    });
  }
  // One measured value per material (entropies, heat capacities, ε∞); `hash` is what follows material and quantity in its row hash.
  type PerMaterial = { material: string; source: string; quantity: 'entropy' | 'heat-capacity' | 'eps-inf' | 'born-charge'; text: string; unit: string; uncertainty?: string; temperatureK?: number | null; notes?: string; site?: string };
  const insertPerMaterial = (v: PerMaterial, hash: Array<string | number | null>) =>
    tx.insert(measurement).values({
      workspaceId,
      materialId: need(materialIds, v.material, 'material').id,
      sourceId: need(sourceIds, v.source, 'source'),
      quantity: v.quantity,
      value: Number(v.text),
      valueText: v.text,
      unit: v.unit,
      uncertainty: v.uncertainty ? Number(v.uncertainty) : null,
      uncertaintyText: v.uncertainty || null,
      temperatureK: v.temperatureK ?? null,
      technique: v.temperatureK === undefined ? null : 'calorimetry',
      sampleForm: v.temperatureK === undefined ? 'single-crystal' : 'powder',
      notes: v.notes ?? null,
      site: v.site ?? null,
      rowHash: demoRowHash(['measurement', v.material, v.quantity, ...hash]),
      contributorId: userId,
    });
  for (const e of entropies) {
    const v = { material: e.material, source: e.source, quantity: 'entropy', text: e.entropy_J_per_mol_K, unit: 'J/mol/K', uncertainty: e.uncertainty, temperatureK: e.temperature_K } as const;
    await insertPerMaterial(v, [v.text, v.unit, e.temperature_K, e.source]);
  }
  for (const c of heatCapacities) {
    const v = { material: c.material, source: c.source, quantity: 'heat-capacity', text: c.heat_capacity_J_per_mol_K, unit: 'J/mol/K', temperatureK: c.temperature_K, notes: HEAT_CAPACITY_NOTE } as const;
    await insertPerMaterial(v, [v.text, v.unit, c.temperature_K, c.source]);
  }
  for (const d of dielectric) {
    await insertPerMaterial({ material: d.material, source: d.source, quantity: 'eps-inf', text: d.eps_inf, unit: '1', notes: DIELECTRIC_NOTE }, [d.eps_inf, '1', d.source]);
  }

  // One measured charge per element of a binary, the anion's the cation's negated (neutral per formula unit).
  for (const b of born) {
    for (const [site, text] of [
      [b.cation, b.z_e],
      [b.anion, `-${b.z_e}`],
    ]) {
      await insertPerMaterial({ material: b.material, source: b.source, quantity: 'born-charge', text, unit: 'e', notes: BORN_NOTE, site }, [text, 'e', site, b.source]);
    }
  }

  // Methods and their synthetic calculations.
  const random = createRandom(methodsSpec.seed);
  // heat capacities draw from their own generator, so adding them moved no other synthetic value
  const heatRandom = createRandom(methodsSpec.seed + 1);
  const dielectricRandom = createRandom(methodsSpec.seed + 2);
  const bornRandom = createRandom(methodsSpec.seed + 3);
  const synthetic = need(sourceIds, 'demo-synthetic-2026', 'source');
  for (const spec of methodsSpec.methods) {
    const [row] = await tx
      .insert(method)
      .values({
        workspaceId,
        label: spec.label,
        functional: spec.functional,
        pseudopotential: spec.pseudopotential,
        cutoffEv: spec.cutoffEv,
        kGrid: spec.kGrid,
        qGrid: spec.qGrid,
        smearing: spec.smearing,
        approach: spec.approach,
        nonAnalyticCorrection: spec.nonAnalyticCorrection,
        notes: 'Invented demo recipe; its calculations are synthetic (generated by the demo seed).',
        createdBy: userId,
      })
      .returning({ id: method.id });
    await writeAudit({ workspaceId, actor, action: 'create', entityType: 'method', entityId: row.id, after: spec, reason: 'demo seed' }, tx);

    const values: Array<typeof calculation.$inferInsert> = [];
    for (const m of materials) {
      const mat = need(materialIds, m.name, 'material');
      const acoustic = spec.acousticOverrides.find((o) => o.material === m.name)?.valueCm1;
      let modeIndex = 0;
      const push = (valueCm1: number, irrep: string | null, branch: '' | 'TO' | 'LO', activity: typeof calculation.$inferInsert.activity, degeneracy: number) => {
        modeIndex++;
        const text = valueCm1.toFixed(2);
        values.push({
          workspaceId,
          materialId: mat.id,
          methodId: row.id,
          sourceId: synthetic,
          quantity: 'frequency',
          value: Number(text),
          valueText: text,
          unit: 'cm-1',
          modeIndex,
          irrep,
          irrepNormalized: irrep ? normalizeIrrep(irrep) : null,
          branch: branch || null,
          degeneracy,
          activity,
          rowHash: demoRowHash(['calculation', m.name, spec.label, 'frequency', text, modeIndex]),
          contributorId: userId,
        });
      };
      for (let i = 0; i < 3; i++) push(i === 0 && acoustic !== undefined ? acoustic : round(gaussian(random) * 0.3, 2), null, '', 'acoustic', 1);
      const seen = new Map<string, number>();
      for (const mode of modes.filter((x) => x.material === m.name)) {
        if (!mode.degeneracy) continue; // measured-only line: the A1(LO) peaks of the wurtzites (see data/demo/README.md)
        const key = `${mode.irrep}|${mode.branch}`;
        const nth = (seen.get(key) ?? 0) + 1;
        seen.set(key, nth);
        const reference = mode.measured_cm1 ? Number(mode.measured_cm1) : mode.reference_cm1!;
        const override = spec.overrides.find((o) => o.material === m.name && o.irrep === mode.irrep && (o.branch ?? '') === mode.branch && o.nth === nth);
        let value = reference * (1 + spec.frequencyBias + spec.frequencyNoise * gaussian(random));
        if (override?.valueCm1 !== undefined) value = override.valueCm1;
        else if (override?.scale !== undefined) value = reference * override.scale;
        const label = mode.branch ? `${mode.irrep}(${mode.branch})` : mode.irrep;
        push(value, label, mode.branch, mode.activity, mode.degeneracy);
      }
    }
    // one synthetic value per material: the measured one × (1 + bias + noise · g), to two decimals
    const perMaterial = (material: string, quantity: PerMaterial['quantity'], measured: string, bias: number, noise: number, draw: () => number, unit: string, temperatureK?: number | null) => {
      const text = (Number(measured) * (1 + bias + noise * draw())).toFixed(2);
      values.push({
        workspaceId,
        materialId: need(materialIds, material, 'material').id,
        methodId: row.id,
        sourceId: synthetic,
        quantity,
        value: Number(text),
        valueText: text,
        unit,
        temperatureK: temperatureK ?? null,
        rowHash: demoRowHash(['calculation', material, spec.label, quantity, text, ...(temperatureK === undefined ? [] : [temperatureK])]),
        contributorId: userId,
      });
    };
    for (const e of entropies) perMaterial(e.material, 'entropy', e.entropy_J_per_mol_K, spec.entropyBias, spec.entropyNoise, () => gaussian(random), 'J/mol/K', e.temperature_K);
    for (const c of heatCapacities) perMaterial(c.material, 'heat-capacity', c.heat_capacity_J_per_mol_K, spec.heatCapacityBias, spec.heatCapacityNoise, () => gaussian(heatRandom), 'J/mol/K', c.temperature_K);
    for (const d of dielectric) perMaterial(d.material, 'eps-inf', d.eps_inf, spec.epsInfBias, spec.epsInfNoise, () => gaussian(dielectricRandom), '1');
    // Born charges: an isotropic tensor per element (cubic binaries), the anion's the cation's negated, so every set is neutral.
    for (const b of born) {
      const z = Number((Number(b.z_e) * (1 + spec.bornBias + spec.bornNoise * gaussian(bornRandom))).toFixed(2));
      for (const [site, charge] of [
        [b.cation, z],
        [b.anion, -z],
      ] as const) {
        const text = charge.toFixed(2);
        values.push({
          workspaceId,
          materialId: need(materialIds, b.material, 'material').id,
          methodId: row.id,
          sourceId: synthetic,
          quantity: 'born-charge',
          value: charge,
          valueText: text,
          unit: 'e',
          site,
          components: [charge, 0, 0, 0, charge, 0, 0, 0, charge],
          rowHash: demoRowHash(['calculation', b.material, spec.label, 'born-charge', site, text]),
          contributorId: userId,
        });
      }
    }
    for (let i = 0; i < values.length; i += 200) await tx.insert(calculation).values(values.slice(i, i + 200));
  }
  if (options.convergenceFamily) await loadConvergenceFamily(tx, workspaceId, userId, { materials, modes, materialIds, synthetic, seed: methodsSpec.seed });
  return { created: true };
}

const convergenceFile = z.object({
  functional: z.string(),
  pseudopotential: z.string(),
  cutoffEv: z.number(),
  qGrid: z.tuple([z.number(), z.number(), z.number()]),
  members: z.array(z.number().int().positive()).min(2),
  reference: z.number().int().positive(),
  bias: z.number(),
  noise: z.number(),
  toleranceCm1: z.number().positive(),
  scaleK: z.number().positive(),
  kneeMin: z.number().positive(),
  kneeMax: z.number().positive(),
  neverConverges: z.string(),
});

/** Labels of the invented convergence family: its members by k-grid, then its reference. */
export function convergenceLabels(): { members: string[]; reference: string } {
  const spec = convergenceFile.parse(JSON.parse(readFileSync(fileURLToPath(new URL('convergence.json', dataDir)), 'utf8')));
  const label = (k: number) => `${spec.functional} · PAW · k${k} (convergence)`;
  return { members: spec.members.map(label), reference: `${spec.functional} · PAW · k${spec.reference} (reference)` };
}

/** The invented k-point convergence family of data/demo/convergence.json (its _note says how the values are made). */
async function loadConvergenceFamily(
  tx: Executor,
  workspaceId: string,
  userId: string,
  demo: {
    materials: Array<z.infer<typeof materialRow>>;
    modes: Array<z.infer<typeof modeRow>>;
    materialIds: Map<string, { id: string }>;
    synthetic: string;
    seed: number;
  },
) {
  const spec = convergenceFile.parse(JSON.parse(readFileSync(fileURLToPath(new URL('convergence.json', dataDir)), 'utf8')));
  const labels = convergenceLabels();
  const random = createRandom(demo.seed + 3);
  // The reference's optical modes and each material's knee K*, drawn once per material.
  const cells = demo.materials.map((m) => {
    const optical = demo.modes
      .filter((x) => x.material === m.name && x.degeneracy)
      .map((mode, i) => {
        const base = mode.measured_cm1 ? Number(mode.measured_cm1) : mode.reference_cm1!;
        return {
          value: round(base * (1 + spec.bias + spec.noise * gaussian(random)), 2),
          label: mode.branch ? `${mode.irrep}(${mode.branch})` : mode.irrep,
          branch: mode.branch || null,
          activity: mode.activity,
          degeneracy: mode.degeneracy,
          u: i === 0 ? 1 : 0.3 + 0.7 * random(),
          sign: random() < 0.5 ? -1 : 1,
        };
      });
    return { material: m, optical, knee: spec.kneeMin + (spec.kneeMax - spec.kneeMin) * random() };
  });
  const deviation = (kppra: number, knee: number, never: boolean) =>
    never ? spec.toleranceCm1 * (1.5 + 3 * Math.exp(-kppra / 600)) : spec.toleranceCm1 * Math.exp(-(kppra - knee) / spec.scaleK);

  const family = [...spec.members.map((k, i) => ({ k, label: labels.members[i] })), { k: spec.reference, label: labels.reference }];
  for (const { k, label } of family) {
    const isReference = k === spec.reference;
    const [row] = await tx
      .insert(method)
      .values({
        workspaceId,
        label,
        functional: spec.functional,
        pseudopotential: spec.pseudopotential,
        cutoffEv: spec.cutoffEv,
        kGrid: [k, k, k],
        qGrid: spec.qGrid,
        smearing: 'none (insulators)',
        approach: 'perturbation',
        nonAnalyticCorrection: true,
        notes: `Invented demo recipe of a k-point convergence family${isReference ? ' (its dense reference)' : ''}; its calculations are synthetic (generated by the demo seed).`,
        createdBy: userId,
      })
      .returning({ id: method.id });
    await writeAudit({ workspaceId, actor: { userId }, action: 'create', entityType: 'method', entityId: row.id, after: { label, kGrid: [k, k, k] }, reason: 'demo seed' }, tx);
    const values: Array<typeof calculation.$inferInsert> = [];
    for (const { material: m, optical, knee } of cells) {
      const materialId = demo.materialIds.get(m.name)!.id;
      const d = isReference ? 0 : deviation(k * k * k * (m.atoms_in_cell ?? 1), knee, m.name === spec.neverConverges);
      const rows = [
        ...[0, 1, 2].map(() => ({ value: 0, label: null, branch: null, activity: 'acoustic' as const, degeneracy: 1 })),
        ...optical.map((o) => ({ value: round(o.value + o.sign * o.u * d, 2), label: o.label, branch: o.branch, activity: o.activity, degeneracy: o.degeneracy })),
      ];
      rows.forEach((r, i) => {
        const text = r.value.toFixed(2);
        values.push({
          workspaceId,
          materialId,
          methodId: row.id,
          sourceId: demo.synthetic,
          quantity: 'frequency',
          value: Number(text),
          valueText: text,
          unit: 'cm-1',
          modeIndex: i + 1,
          irrep: r.label,
          irrepNormalized: r.label ? normalizeIrrep(r.label) : null,
          branch: (r.branch || null) as 'TO' | 'LO' | null,
          degeneracy: r.degeneracy,
          activity: r.activity,
          rowHash: demoRowHash(['calculation', m.name, label, 'frequency', text, i + 1]),
          contributorId: userId,
        });
      });
    }
    for (let i = 0; i < values.length; i += 200) await tx.insert(calculation).values(values.slice(i, i + 200));
  }
}
