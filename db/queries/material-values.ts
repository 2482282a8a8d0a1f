import 'server-only';
import { and, asc, eq, isNull } from 'drizzle-orm';
import { db } from '@/db/client';
import { calculation, measurement, method, source } from '@/db/schema';

/**
 * The measured and computed values of one material (unretracted), read-only:
 * measurements with their source, calculations grouped per method.
 */
export async function getMaterialValues(workspaceId: string, materialId: string) {
  const [measured, computed] = await Promise.all([
    db
      .select({
        id: measurement.id,
        quantity: measurement.quantity,
        value: measurement.value,
        valueText: measurement.valueText,
        unit: measurement.unit,
        uncertainty: measurement.uncertainty,
        uncertaintyText: measurement.uncertaintyText,
        temperatureK: measurement.temperatureK,
        irrep: measurement.irrep,
        branch: measurement.branch,
        activity: measurement.activity,
        site: measurement.site,
        components: measurement.components,
        technique: measurement.technique,
        sampleForm: measurement.sampleForm,
        sourceId: source.id,
        citeKey: source.citeKey,
        sourceGaps: source.gaps,
      })
      .from(measurement)
      .innerJoin(source, eq(measurement.sourceId, source.id))
      .where(and(eq(measurement.workspaceId, workspaceId), eq(measurement.materialId, materialId), isNull(measurement.retractedAt)))
      .orderBy(asc(measurement.quantity), asc(measurement.value)),
    db
      .select({
        id: calculation.id,
        quantity: calculation.quantity,
        value: calculation.value,
        valueText: calculation.valueText,
        unit: calculation.unit,
        temperatureK: calculation.temperatureK,
        irrep: calculation.irrep,
        branch: calculation.branch,
        degeneracy: calculation.degeneracy,
        activity: calculation.activity,
        modeIndex: calculation.modeIndex,
        site: calculation.site,
        components: calculation.components,
        methodId: method.id,
        methodLabel: method.label,
        sourceId: source.id,
        citeKey: source.citeKey,
        sourceGaps: source.gaps,
      })
      .from(calculation)
      .innerJoin(method, eq(calculation.methodId, method.id))
      .innerJoin(source, eq(calculation.sourceId, source.id))
      .where(and(eq(calculation.workspaceId, workspaceId), eq(calculation.materialId, materialId), isNull(calculation.retractedAt)))
      .orderBy(asc(method.label), asc(calculation.quantity), asc(calculation.modeIndex), asc(calculation.value)),
  ]);

  const methods = new Map<string, { methodId: string; methodLabel: string; modes: typeof computed; entropies: typeof computed; heatCapacities: typeof computed; dielectric: typeof computed; born: typeof computed }>();
  for (const row of computed) {
    let group = methods.get(row.methodId);
    if (!group) {
      group = { methodId: row.methodId, methodLabel: row.methodLabel, modes: [], entropies: [], heatCapacities: [], dielectric: [], born: [] };
      methods.set(row.methodId, group);
    }
    if (row.quantity === 'frequency') group.modes.push(row);
    else if (row.quantity === 'entropy') group.entropies.push(row);
    else if (row.quantity === 'heat-capacity') group.heatCapacities.push(row);
    else if (row.quantity === 'eps-inf' || row.quantity === 'eps-static') group.dielectric.push(row);
    else if (row.quantity === 'born-charge') group.born.push(row);
  }

  return {
    peaks: measured.filter((m) => m.quantity === 'frequency'),
    entropies: measured.filter((m) => m.quantity === 'entropy'),
    heatCapacities: measured.filter((m) => m.quantity === 'heat-capacity'),
    dielectric: measured.filter((m) => m.quantity === 'eps-inf' || m.quantity === 'eps-static'),
    born: measured.filter((m) => m.quantity === 'born-charge'),
    methods: [...methods.values()],
  };
}

export type MaterialValues = Awaited<ReturnType<typeof getMaterialValues>>;
export type MeasuredPeakRow = MaterialValues['peaks'][number];
export type ComputedModeRow = MaterialValues['methods'][number]['modes'][number];
