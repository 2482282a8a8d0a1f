import { describe, expect, it } from 'vitest';
import {
  MINUS,
  asEntered,
  count,
  csvNumber,
  fixed,
  header,
  pValue,
  plain,
  scientific,
  significant,
  significantFiguresOf,
  signed,
  stat,
  storedValue,
  utcMinute,
  trueMinus,
  withUnit,
} from '@/lib/format';
import { convertFrequency } from '@/lib/science/units';

describe('fixed and signed', () => {
  it('write a true minus sign (U+2212), never a hyphen', () => {
    expect(fixed(-7.381, 3)).toBe(`${MINUS}7.381`);
    expect(fixed(-7.381, 3).charCodeAt(0)).toBe(0x2212);
    expect(signed(-74.4)).toBe('−74.40');
    expect(signed(29.874)).toBe('+29.87');
  });

  it('do not print a negative zero after rounding', () => {
    expect(fixed(-0.001, 2)).toBe('0.00');
    expect(fixed(-0, 1)).toBe('0.0');
    expect(signed(-0.004, 2)).toBe('±0.00');
    expect(signed(0)).toBe('±0.00');
  });

  it('show a dash for what is missing', () => {
    expect(fixed(null)).toBe('—');
    expect(fixed(undefined)).toBe('—');
    expect(fixed(Number.NaN)).toBe('—');
    expect(signed(Number.POSITIVE_INFINITY)).toBe('—');
  });
});

describe('stat: fixed decimals per kind of number', () => {
  it('gives z-scores two decimals whatever their size (not −5.2 beside −5.14)', () => {
    expect(stat('score', -5.2)).toBe('−5.20');
    expect(stat('score', -5.1449)).toBe('−5.14');
  });
  it('uses the documented decimals of each kind', () => {
    expect(stat('error', 3.7)).toBe('3.70');
    expect(stat('percent', 12.345)).toBe('12.3');
    expect(stat('correlation', 0.99951)).toBe('1.000');
    expect(stat('scaleFactor', 0.97123)).toBe('0.9712');
  });
});

describe('significant figures', () => {
  it('counts the figures of a number as written', () => {
    expect(significantFiguresOf('12.15')).toBe(4);
    expect(significantFiguresOf('0.0200')).toBe(3);
    expect(significantFiguresOf('569')).toBe(3);
    expect(significantFiguresOf('1300')).toBe(4);
    expect(significantFiguresOf('-1.50')).toBe(3);
    expect(significantFiguresOf('1.30e3')).toBe(3);
    expect(significantFiguresOf('0')).toBe(1);
  });

  it('rounds to n figures in positional notation', () => {
    expect(significant(405.28012, 4)).toBe('405.3');
    expect(significant(1332.7, 2)).toBe('1300');
    expect(significant(0.020000001, 3)).toBe('0.0200');
    expect(significant(9.996, 3)).toBe('10.0');
    expect(significant(-0.000123456, 2)).toBe('−0.00012');
    expect(significant(0, 3)).toBe('0.00');
  });

  it('shows a conversion with the precision of its input, not more', () => {
    // 12.15 THz × 33.356 409 52 cm⁻¹/THz (CODATA 2018, derived) = 405.280 cm⁻¹ to 6 figures; the input had 4.
    const cm1 = convertFrequency(12.15, 'THz', 'cm-1');
    expect(cm1.toPrecision(6)).toBe('405.280');
    expect(asEntered(cm1, '12.15')).toBe('405.3');
    // 98.6 entered in cm⁻¹ stays 98.6, not 98.6000
    expect(asEntered(98.6, '98.6', true)).toBe('98.6');
    // the text as typed keeps its zeros: "1.50" is 1.50
    expect(asEntered(1.5, '1.50', true)).toBe('1.50');
    expect(asEntered(-58, '-58', true)).toBe('−58');
  });

  it('reads a stored value in its canonical unit with the typed precision', () => {
    expect(storedValue({ quantity: 'frequency', value: 569, valueText: '569', unit: 'cm-1' })).toBe('569\u00a0cm⁻¹');
    const meV = 70.5; // 70.5 meV × 8.065 544 cm⁻¹/meV (derived from CODATA 2018) = 568.62 cm⁻¹
    expect(storedValue({ quantity: 'frequency', value: convertFrequency(meV, 'meV', 'cm-1'), valueText: '70.5', unit: 'meV' })).toBe('569\u00a0cm⁻¹');
    expect(storedValue({ quantity: 'entropy', value: 18.81, valueText: '18.81', unit: 'J/mol/K' })).toBe('18.81\u00a0J mol⁻¹ K⁻¹');
  });
});

describe('exports: csvNumber', () => {
  it('drops the noise of a subtraction and keeps the real digits', () => {
    expect(531.85 - 520.45).not.toBe(11.4);
    expect(csvNumber(531.85 - 520.45)).toBe('11.4');
    expect(csvNumber(1000.01 - 1000)).toBe('0.01');
    expect(csvNumber(0.1 + 0.2)).toBe('0.3');
    expect(csvNumber(405.28012345)).toBe('405.2801235');
  });
  it('stays machine-readable: ASCII minus, no separators, integers untouched', () => {
    expect(csvNumber(-35.2)).toBe('-35.2');
    expect(csvNumber(1767225600123)).toBe('1767225600123');
    expect(csvNumber(-0)).toBe('0');
    expect(csvNumber(Number.NaN)).toBe('');
  });
});

describe('plain, count, pValue, units and dates', () => {
  it('plain shows a number with its own digits', () => {
    expect(plain(531.85 - 520.45)).toBe('11.4');
    expect(plain(569)).toBe('569');
    expect(plain(-87)).toBe('−87');
    expect(plain(298.15)).toBe('298.15');
  });
  it('count groups thousands', () => {
    expect(count(1234567)).toBe('1,234,567');
    expect(count(-1200)).toBe('−1,200');
  });
  it('pValue switches to a power of ten below 10⁻⁴', () => {
    expect(pValue(0.04321)).toBe('0.0432');
    expect(pValue(0.0000321)).toBe('3.2 × 10⁻⁵');
  });
  it('scientific writes small and large numbers as a power of ten, the rest plainly', () => {
    expect(scientific(3.12e-5)).toBe('3.12 × 10⁻⁵');
    expect(scientific(-2.7e-5)).toBe('−2.7 × 10⁻⁵');
    expect(scientific(1.2e-4, 6)).toBe('1.2 × 10⁻⁴');
    expect(scientific(12345)).toBe('1.23 × 10⁴');
    expect(scientific(160)).toBe('160');
    expect(scientific(0.0123)).toBe('0.0123');
    expect(scientific(0)).toBe('0');
    expect(scientific(null)).toBe('—');
  });
  it('joins a number and its unit without a stray space', () => {
    expect(withUnit('3.70', 'cm⁻¹')).toBe('3.70\u00a0cm⁻¹');
    expect(withUnit('—', 'cm⁻¹')).toBe('—');
    expect(header('Best MAE', 'cm⁻¹')).toBe('Best MAE (cm⁻¹)');
    expect(header('N', null)).toBe('N');
  });
  it('trueMinus fixes the signs of numbers inside a sentence, not hyphens', () => {
    expect(trueMinus('modified z-score -5.14 beyond ±3.5')).toBe('modified z-score −5.14 beyond ±3.5');
    expect(trueMinus('error -74.40 cm⁻¹ (range -0.5 to 2)')).toBe('error −74.40 cm⁻¹ (range −0.5 to 2)');
    expect(trueMinus('PBE-D3 k12 mode-3 1e-5')).toBe('PBE-D3 k12 mode-3 1e-5');
  });
  it('writes minutes in UTC', () => {
    expect(utcMinute(Date.UTC(2026, 2, 12, 9, 41, 30))).toBe('2026-03-12 09:41 UTC');
  });
});
