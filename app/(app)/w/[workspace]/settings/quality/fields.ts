import { DEFAULT_QUALITY_THRESHOLDS, type QualityThresholds } from '@/lib/science';

export type ThresholdKey = keyof Required<QualityThresholds>;

export interface ThresholdField {
  key: ThresholdKey;
  label: string;
  unit: string;
  /** Largest accepted value: beyond it a check could never fire, which is more likely a typo. */
  max: number;
  step: string;
  defaultValue: number;
  explanation: string;
}

/** The quality thresholds of a workspace, in the order of the form, with their documented defaults. */
export const THRESHOLD_FIELDS: readonly ThresholdField[] = [
  {
    key: 'kPointsPerReciprocalAtom',
    label: 'k-point density target',
    unit: 'k-points × atoms',
    max: 1_000_000,
    step: '1',
    defaultValue: DEFAULT_QUALITY_THRESHOLDS.kPointsPerReciprocalAtom,
    explanation:
      'A method’s k-grid k₁·k₂·k₃ times the atoms in the primitive cell should reach this; 1500 per reciprocal atom is the common rule of thumb of high-throughput phonon work.',
  },
  {
    key: 'acousticCm1',
    label: 'Acoustic sum rule limit',
    unit: 'cm⁻¹',
    max: 500,
    step: 'any',
    defaultValue: DEFAULT_QUALITY_THRESHOLDS.acousticCm1,
    explanation: 'The three acoustic modes at Γ should be at zero; a larger |ω| flags a broken acoustic sum rule.',
  },
  {
    key: 'imaginaryCm1',
    label: 'Imaginary mode limit',
    unit: 'cm⁻¹',
    max: 500,
    step: 'any',
    defaultValue: DEFAULT_QUALITY_THRESHOLDS.imaginaryCm1,
    explanation: 'An optical mode below minus this value is flagged as imaginary: a dynamical instability or an unconverged calculation.',
  },
  {
    key: 'bornNeutrality',
    label: 'Born-charge neutrality',
    unit: 'e',
    max: 10,
    step: 'any',
    defaultValue: DEFAULT_QUALITY_THRESHOLDS.bornNeutrality,
    explanation: 'The Born effective charges of a cell should sum to zero in every Cartesian component.',
  },
  {
    key: 'lstRelative',
    label: 'Lyddane–Sachs–Teller tolerance',
    unit: 'relative',
    max: 1,
    step: 'any',
    defaultValue: DEFAULT_QUALITY_THRESHOLDS.lstRelative,
    explanation: 'Largest relative deviation of Π(ω_LO/ω_TO)² from ε₀/ε∞ (0.05 = 5 %).',
  },
];
