/** A benchmark's scope in words, for the header and the empty state. */
import type { BenchmarkScope } from './schemas';

const TECHNIQUE_NAMES: Record<string, string> = {
  raman: 'Raman',
  'ir-reflectance': 'IR reflectance',
  'ir-absorption': 'IR absorption',
  ins: 'INS',
  'hyper-raman': 'hyper-Raman',
  calorimetry: 'calorimetry',
};

export function techniqueName(t: string | null): string {
  return t ? (TECHNIQUE_NAMES[t] ?? t) : '—';
}

export function describeScope(scope: BenchmarkScope, names: { methods: string[]; materials: string[]; reference?: string }): string {
  const parts: string[] = [];
  const at = scope.entropyTemperatureK === null ? `at every measured temperature (± ${scope.entropyToleranceK} K)` : `at ${scope.entropyTemperatureK} ± ${scope.entropyToleranceK} K`;
  if (scope.quantity === 'frequency') parts.push('Γ-point frequencies');
  else if (scope.quantity === 'entropy') parts.push(`vibrational entropies ${at}`);
  else if (scope.quantity === 'heat-capacity') parts.push(`heat capacities (measured Cp, computed Cv) ${at}`);
  else if (scope.quantity === 'born-charge') parts.push('Born effective charges per site');
  else if (scope.quantity === 'lo-to-splitting') parts.push('LO–TO splittings of polar modes');
  else parts.push(scope.quantity === 'eps-inf' ? 'electronic dielectric constants ε∞' : 'static dielectric constants ε₀');
  if (scope.techniques.length) parts.push(`measured by ${scope.techniques.map(techniqueName).join(' or ')}`);
  if (scope.quantity === 'frequency' || scope.quantity === 'lo-to-splitting') {
    const { temperatureMinK: lo, temperatureMaxK: hi } = scope;
    if (lo !== null && hi !== null) parts.push(`between ${lo} and ${hi} K`);
    else if (lo !== null) parts.push(`at ${lo} K or above`);
    else if (hi !== null) parts.push(`at ${hi} K or below`);
  }
  if (scope.materialIds.length) parts.push(`for ${names.materials.length ? names.materials.join(', ') : `${scope.materialIds.length} listed materials`}`);
  else if (scope.materialTags.length) parts.push(`for materials tagged ${scope.materialTags.join(' or ')}`);
  else parts.push('for every material');
  if (scope.referenceMethodId !== undefined) {
    parts.push(scope.methodIds.length ? `under ${names.methods.join(', ') || `${scope.methodIds.length} methods`}` : 'under every other method');
    parts.push(`against the reference method ${names.reference ?? 'named in the scope'}`);
    return parts.join(' ');
  }
  parts.push(scope.methodIds.length ? `under ${names.methods.join(', ') || `${scope.methodIds.length} methods`}` : 'under every method');
  return parts.join(' ');
}
