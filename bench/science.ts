/**
 * Benchmark of the science core on a synthetic high-throughput set:
 * 1,500 materials × 5 methods, 30 computed modes and 4 measured peaks per material,
 * 1,000 bootstrap resamples per method. Times pairing + full statistics (+ modified-z
 * outlier flags) in CPU and wall time, next to a floor measured in the same run: a plain
 * loop computing only the MAE of the same errors. Run with `npm run bench:science`.
 */
import { performance } from 'node:perf_hooks';
import {
  createRandom,
  errorStatistics,
  flagOutliers,
  pairModes,
  type ComputedMode,
  type ErrorStatistics,
  type MeasuredPeak,
  type PairValue,
} from '../lib/science';

const MATERIALS = 1500;
const METHODS = 5;
const MODES = 30;
const PEAKS = 4;
const BOOTSTRAP = 1000;
const TARGET_CPU_MS = 1000;

interface Material {
  measured: MeasuredPeak[];
  computedByMethod: ComputedMode[][];
}

const LABELS = [
  { irrep: 'A1g', ramanActive: true, irActive: false },
  { irrep: 'Eg', ramanActive: true, irActive: false },
  { irrep: 'T2g', ramanActive: true, irActive: false },
  { irrep: 'A2u', ramanActive: false, irActive: true },
  { irrep: 'Eu', ramanActive: false, irActive: true },
  { irrep: 'B1u', ramanActive: false, irActive: false },
];

function syntheticSet(): Material[] {
  const random = createRandom(2024);
  const methodBias = [-0.03, -0.01, 0.0, 0.015, 0.04];
  const materials: Material[] = [];
  for (let m = 0; m < MATERIALS; m++) {
    const truth = Array.from({ length: MODES - 3 }, () => ({ frequencyCm1: 40 + 1100 * random(), ...LABELS[(random() * LABELS.length) | 0] }));
    const measured: MeasuredPeak[] = [];
    const chosen = new Set<number>();
    while (measured.length < PEAKS) {
      const k = (random() * truth.length) | 0;
      if (chosen.has(k)) continue;
      chosen.add(k);
      const mode = truth[k];
      const labelled = random() < 0.7;
      measured.push({
        id: `m${m}-p${measured.length}`,
        frequencyCm1: mode.frequencyCm1 + 4 * (random() - 0.5),
        uncertaintyCm1: 1 + random(),
        technique: mode.ramanActive ? 'raman' : mode.irActive ? 'ir' : 'ins',
        irrep: labelled ? mode.irrep : undefined,
      });
    }
    const computedByMethod = methodBias.map((bias, method) => {
      const modes: ComputedMode[] = [0, 1, 2].map((a) => ({ id: `c${m}-${method}-a${a}`, frequencyCm1: 0.5 * (random() - 0.5) }));
      truth.forEach((mode, k) =>
        modes.push({
          id: `c${m}-${method}-${k}`,
          frequencyCm1: mode.frequencyCm1 * (1 + bias) + 6 * (random() - 0.5),
          irrep: mode.irrep,
          ramanActive: mode.ramanActive,
          irActive: mode.irActive,
        }),
      );
      return modes;
    });
    materials.push({ measured, computedByMethod });
  }
  return materials;
}

interface RunResult {
  pairCpuMs: number;
  statsCpuMs: number;
  appCpuMs: number;
  appWallMs: number;
  errors: Float64Array[];
  statistics: ErrorStatistics[];
  outliers: number[];
}

function cpuMs(start: NodeJS.CpuUsage): number {
  const used = process.cpuUsage(start);
  return (used.user + used.system) / 1000;
}

function runApp(materials: Material[]): RunResult {
  const wallStart = performance.now();
  const cpuStart = process.cpuUsage();
  const pairsByMethod: PairValue[][] = Array.from({ length: METHODS }, () => []);
  for (const material of materials) {
    for (let method = 0; method < METHODS; method++) {
      const { pairs } = pairModes(material.measured, material.computedByMethod[method]);
      for (const pair of pairs) pairsByMethod[method].push({ measured: pair.measuredCm1, calculated: pair.calculatedCm1 });
    }
  }
  const pairCpuMs = cpuMs(cpuStart);
  const statsStart = process.cpuUsage();
  const statistics = pairsByMethod.map((pairs, method) => errorStatistics(pairs, { bootstrapSamples: BOOTSTRAP, seed: method + 1 }));
  const outliers = pairsByMethod.map((pairs) => flagOutliers(pairs, { kind: 'modified-z', threshold: 3.5 }).filter(Boolean).length);
  const statsCpuMs = cpuMs(statsStart);
  const appCpuMs = cpuMs(cpuStart);
  const appWallMs = performance.now() - wallStart;
  const errors = pairsByMethod.map((pairs) => Float64Array.from(pairs, (p) => p.calculated - p.measured));
  return { pairCpuMs, statsCpuMs, appCpuMs, appWallMs, errors, statistics, outliers };
}

/** The floor: only the MAE of the same errors, in a plain loop (averaged over repetitions for timer resolution). */
function floorMs(errors: Float64Array[]): { ms: number; checksum: number } {
  const repetitions = 200;
  let checksum = 0;
  const start = performance.now();
  for (let r = 0; r < repetitions; r++) {
    for (const e of errors) {
      let sum = 0;
      for (let i = 0; i < e.length; i++) sum += Math.abs(e[i]);
      checksum += sum / e.length;
    }
  }
  return { ms: (performance.now() - start) / repetitions, checksum: checksum / repetitions };
}

function pad(text: string, width: number): string {
  return text.padEnd(width);
}

const materials = syntheticSet();
const runs = [runApp(materials), runApp(materials), runApp(materials)];
const first = runs[0];
const floor = floorMs(first.errors);
const sortedCpu = runs.map((r) => r.appCpuMs).sort((a, b) => a - b);
const medianCpu = sortedCpu[1];
const totalPairs = first.errors.reduce((s, e) => s + e.length, 0);

console.log(`science benchmark: ${MATERIALS} materials × ${METHODS} methods, ${MODES} modes, ${PEAKS} peaks, ${BOOTSTRAP} bootstrap resamples per method`);
console.log(`pairs formed: ${totalPairs} (of ${MATERIALS * METHODS * PEAKS} peaks × methods)\n`);
console.log(`${pad('stage', 54)}${pad('CPU ms', 12)}wall ms`);
console.log(`${pad('pairing (first run)', 54)}${pad(first.pairCpuMs.toFixed(1), 12)}`);
console.log(`${pad('statistics + bootstrap + outliers (first run)', 54)}${pad(first.statsCpuMs.toFixed(1), 12)}`);
runs.forEach((r, i) =>
  console.log(`${pad(`app total, run ${i + 1} (pairing ${r.pairCpuMs.toFixed(0)} + statistics ${r.statsCpuMs.toFixed(0)})`, 54)}${pad(r.appCpuMs.toFixed(1), 12)}${r.appWallMs.toFixed(1)}`),
);
console.log(`${pad('floor: plain MAE loop over the same errors', 54)}${pad('', 12)}${floor.ms.toFixed(3)}`);
console.log('');
console.log(`app (median of 3, CPU): ${medianCpu.toFixed(1)} ms — target < ${TARGET_CPU_MS} ms: ${medianCpu < TARGET_CPU_MS ? 'met' : 'NOT met'}`);
console.log(`app (first run, CPU):   ${first.appCpuMs.toFixed(1)} ms — target < ${TARGET_CPU_MS} ms: ${first.appCpuMs < TARGET_CPU_MS ? 'met' : 'NOT met'}`);
console.log(`ratio app / floor (median wall): ${(runs.map((r) => r.appWallMs).sort((a, b) => a - b)[1] / floor.ms).toFixed(0)}×`);
console.log('');
console.log(`${pad('method', 10)}${pad('N', 8)}${pad('MAE', 10)}${pad('MAE 95 % CI', 22)}${pad('MSE', 10)}${pad('outliers', 10)}floor MAE`);
first.statistics.forEach((s, method) => {
  const floorMae = first.errors[method].reduce((sum, e) => sum + Math.abs(e), 0) / first.errors[method].length;
  const ci = s.bootstrap ? `[${s.bootstrap.meanAbsoluteError[0].toFixed(2)}, ${s.bootstrap.meanAbsoluteError[1].toFixed(2)}]` : '—';
  console.log(
    `${pad(`m${method + 1}`, 10)}${pad(String(s.n), 8)}${pad(s.meanAbsoluteError.toFixed(3), 10)}${pad(ci, 22)}${pad(s.meanSignedError.toFixed(3), 10)}${pad(String(first.outliers[method]), 10)}${floorMae.toFixed(3)}`,
  );
});
if (Math.abs(floor.checksum - first.statistics.reduce((s, x) => s + x.meanAbsoluteError, 0)) > 1e-6) {
  console.log('warning: the floor MAE disagrees with the app MAE');
}
