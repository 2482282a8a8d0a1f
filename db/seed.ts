/**
 * Demo seed (idempotent): an invented research group, its members in every role
 * and a workspace. Everything here is invented demo data (see data/demo/group.json).
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { and, eq, inArray } from 'drizzle-orm';
import { z } from 'zod';
import { getAuth } from '@/lib/auth';
import { db, closeDb } from '@/db/client';
import { member, method, organization, user } from '@/db/schema';
import { ensureWorkspaceSettings } from '@/db/queries/workspaces';
import { WORKSPACE_ROLES } from '@/lib/permissions';
import { convergenceLabels, loadDemoScenario } from '@/db/demo-data';
import { benchmark } from '@/db/schema';
import { createBenchmark } from '@/db/queries/benchmarks';
import { recomputeBenchmark } from '@/lib/services/benchmarks/recompute';
import type { BenchmarkDefinitionInput } from '@/lib/benchmark/schemas';

const groupSchema = z.object({
  password: z.string().min(10),
  workspace: z.object({ name: z.string(), slug: z.string() }),
  members: z.array(z.object({ name: z.string(), email: z.email(), role: z.enum(WORKSPACE_ROLES) })).min(1),
});

export type DemoGroup = z.infer<typeof groupSchema>;

export function loadDemoGroup(): DemoGroup {
  const path = fileURLToPath(new URL('../data/demo/group.json', import.meta.url));
  return groupSchema.parse(JSON.parse(readFileSync(path, 'utf8')));
}

async function ensureUser(name: string, email: string, password: string): Promise<string> {
  const existing = await db.select({ id: user.id }).from(user).where(eq(user.email, email)).limit(1);
  if (existing[0]) return existing[0].id;
  const ctx = await getAuth().$context;
  const created = await ctx.internalAdapter.createUser({ name, email, emailVerified: true }, { method: 'admin' });
  await ctx.internalAdapter.linkAccount({ userId: created.id, providerId: 'credential', accountId: created.id, password: await ctx.password.hash(password) });
  return created.id;
}

export async function seedDemo(): Promise<{ workspaceId: string; group: DemoGroup }> {
  const group = loadDemoGroup();
  const ids: string[] = [];
  for (const m of group.members) ids.push(await ensureUser(m.name, m.email, group.password));

  const owner = group.members.findIndex((m) => m.role === 'owner');
  let workspace = (await db.select({ id: organization.id }).from(organization).where(eq(organization.slug, group.workspace.slug)).limit(1))[0];
  if (!workspace) {
    const created = await getAuth().api.createOrganization({ body: { name: group.workspace.name, slug: group.workspace.slug, userId: ids[owner] } });
    workspace = { id: created.id };
  }
  await ensureWorkspaceSettings(workspace.id);
  for (const [i, m] of group.members.entries()) {
    const existing = await db
      .select({ id: member.id })
      .from(member)
      .where(and(eq(member.organizationId, workspace.id), eq(member.userId, ids[i])))
      .limit(1);
    if (!existing[0]) await getAuth().api.addMember({ body: { userId: ids[i], role: m.role, organizationId: workspace.id } });
  }
  const curator = group.members.findIndex((m) => m.role === 'curator');
  const curatorId = ids[curator >= 0 ? curator : owner];
  await db.transaction((tx) => loadDemoScenario(tx, workspace.id, curatorId));
  for (const definition of DEMO_BENCHMARKS) await ensureBenchmark(workspace.id, curatorId, definition);
  // The convergence study in a workspace of its own, with the same members.
  const study = await ensureWorkspace(CONVERGENCE_WORKSPACE, group, ids, owner);
  await db.transaction((tx) => loadDemoScenario(tx, study, curatorId, { convergenceFamily: true }));
  await ensureBenchmark(study, curatorId, CONVERGENCE_BENCHMARK);
  return { workspaceId: workspace.id, group };
}

/** The invented convergence-study workspace of the demo. */
export const CONVERGENCE_WORKSPACE = { name: 'Halden convergence study (invented demo)', slug: 'halden-convergence' };

async function ensureWorkspace(target: { name: string; slug: string }, group: DemoGroup, ids: string[], owner: number): Promise<string> {
  let workspace = (await db.select({ id: organization.id }).from(organization).where(eq(organization.slug, target.slug)).limit(1))[0];
  if (!workspace) {
    const created = await getAuth().api.createOrganization({ body: { name: target.name, slug: target.slug, userId: ids[owner] } });
    workspace = { id: created.id };
  }
  await ensureWorkspaceSettings(workspace.id);
  for (const [i, m] of group.members.entries()) {
    const existing = await db
      .select({ id: member.id })
      .from(member)
      .where(and(eq(member.organizationId, workspace.id), eq(member.userId, ids[i])))
      .limit(1);
    if (!existing[0]) await getAuth().api.addMember({ body: { userId: ids[i], role: m.role, organizationId: workspace.id } });
  }
  return workspace.id;
}

export const DEMO_BENCHMARK_NAME = 'Γ-point frequencies — all methods (demo)';

/** A demo benchmark whose methods are named by label (the seed resolves them to ids). */
type DemoBenchmark = BenchmarkDefinitionInput & { methodLabels?: string[]; referenceLabel?: string };

const FAMILY = convergenceLabels();

const DEMO_BENCHMARKS: DemoBenchmark[] = [
  {
    name: DEMO_BENCHMARK_NAME,
    purpose: 'Which of the three (invented) recipes reproduces the measured zone-centre frequencies best? Invented demo benchmark.',
    scope: { quantity: 'frequency' },
  },
  {
    name: 'Vibrational entropy at 298 K (demo)',
    purpose: 'Computed harmonic vibrational entropies against calorimetric standard entropies. Invented demo benchmark.',
    scope: { quantity: 'entropy', entropyTemperatureK: 298.15 },
  },
  {
    name: 'Heat capacity at 298 K (demo)',
    purpose: 'Computed harmonic Cv against calorimetric Cp° (NIST-JANAF values recalled from memory); the synthetic Cv values are invented. Invented demo benchmark.',
    scope: { quantity: 'heat-capacity', entropyTemperatureK: 298.15 },
    // eight crystals carry a Cp°: rank from N = 5 rather than the default 10
    rules: { ranking: { minN: 5 } },
  },
  {
    name: 'Electronic dielectric constant ε∞ (demo)',
    purpose: 'Computed ε∞ against measured ε∞; both sides are invented for the demo (the measured values are textbook values moved by 5–6 %). Invented demo benchmark.',
    scope: { quantity: 'eps-inf' },
  },
  {
    name: 'Born effective charges (demo)',
    purpose: 'Computed Born charges (mean of the diagonal) against charges inferred from experiment, per site of nine cubic binaries; both sides are invented for the demo. Invented demo benchmark.',
    scope: { quantity: 'born-charge' },
  },
  {
    name: 'LO–TO splittings (demo)',
    purpose: 'ω_LO − ω_TO of the polar modes, measured against computed, from the demo frequencies (invented). Invented demo benchmark.',
    scope: { quantity: 'lo-to-splitting' },
  },
];

const CONVERGENCE_BENCHMARK: DemoBenchmark = {
    name: 'k-point convergence of PBEsol (demo)',
    purpose:
      'Which k-point density reproduces the dense-grid frequencies within 1 cm⁻¹? Five invented k-grids of one recipe against its invented 24³ reference; every value is synthetic. Invented demo benchmark.',
    scope: { quantity: 'frequency' },
    methodLabels: FAMILY.members,
    referenceLabel: FAMILY.reference,
  };

async function ensureBenchmark(workspaceId: string, userId: string, demo: DemoBenchmark) {
  const { methodLabels = [], referenceLabel, ...rest } = demo;
  const labels = [...methodLabels, ...(referenceLabel ? [referenceLabel] : [])];
  const found = labels.length ? await db.select({ id: method.id, label: method.label }).from(method).where(and(eq(method.workspaceId, workspaceId), inArray(method.label, labels))) : [];
  const idOf = new Map(found.map((m) => [m.label, m.id]));
  // A workspace seeded before a method existed keeps its benchmarks as they were.
  const methodIds = methodLabels.map((l) => idOf.get(l)).filter((id): id is string => id !== undefined);
  const referenceMethodId = referenceLabel ? idOf.get(referenceLabel) : undefined;
  if (referenceLabel && !referenceMethodId) return;
  const definition: BenchmarkDefinitionInput = { ...rest, scope: { ...rest.scope, methodIds, ...(referenceMethodId ? { referenceMethodId } : {}) } };
  const existing = await db
    .select({ id: benchmark.id })
    .from(benchmark)
    .where(and(eq(benchmark.workspaceId, workspaceId), eq(benchmark.name, definition.name)))
    .limit(1);
  const id = existing[0]?.id ?? (await createBenchmark(workspaceId, { userId }, definition)).id;
  await recomputeBenchmark(workspaceId, id, [{ trigger: 'benchmark-created', userId }]);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  seedDemo()
    .then(({ group }) => {
      console.log(`Demo workspace "${group.workspace.name}" ready (invented demo data).`);
      closeDb();
    })
    .catch((e) => {
      console.error(e);
      process.exit(1);
    });
}
