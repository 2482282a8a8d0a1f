import { describe, expect, it } from 'vitest';
import { alertThresholdsSchema, benchmarkDefinitionSchema, readRules, rulesSchema, scopeSchema } from '@/lib/benchmark/schemas';
import { csvCell, toCsv } from '@/lib/csv';
import { bandOf } from '@/lib/benchmark/compute';

describe('benchmark scope and rules', () => {
  it('fills every default from an empty object', () => {
    expect(scopeSchema.parse({})).toEqual({
      quantity: 'frequency',
      techniques: [],
      temperatureMinK: null,
      temperatureMaxK: null,
      materialTags: [],
      materialIds: [],
      methodIds: [],
      entropyTemperatureK: 298.15,
      entropyToleranceK: 1,
    });
    // modified z-score |M| > 3.5: Iglewicz & Hoaglin (1993); pairing window and ambiguity: lib/science defaults
    expect(rulesSchema.parse({})).toEqual({
      maxRelativeDeviation: 0.25,
      labelledMaxRelativeDeviation: 0.5,
      ambiguityCm1: 2,
      ambiguityRelative: 0.01,
      // outlier rules flag nothing below 10 pairs; the scale follows the quantity when unset
      outlierRule: { kind: 'modified-z', threshold: 3.5, minN: 10 },
      repeatedMeasurements: 'separate',
      bootstrapSamples: 1000,
      bandEdgesCm1: [200, 500, 1000],
      ranking: { minN: 10, minCoverage: 0.5 },
      entropyBasis: 'formula-unit',
    });
    // the absolute MAE threshold takes the quantity's default when unset (readAlertThresholds)
    expect(alertThresholdsSchema.parse({})).toEqual({ maeRelative: 0.05, nRelative: 0.1 });
    const def = benchmarkDefinitionSchema.parse({ name: 'x' });
    expect(def.rules.outlierRule.kind).toBe('modified-z');
    expect(readRules(null).bootstrapSamples).toBe(1000);
  });

  it('keeps a partial outlier rule partial: the other field takes its default', () => {
    expect(rulesSchema.parse({ outlierRule: { kind: 'tukey', threshold: 3 } }).outlierRule).toEqual({ kind: 'tukey', threshold: 3, minN: 10 });
    expect(rulesSchema.parse({ outlierRule: { threshold: 5 } }).outlierRule).toEqual({ kind: 'modified-z', threshold: 5, minN: 10 });
  });

  it('refuses an inverted temperature window, unknown techniques and decreasing band edges, saying where', () => {
    const window = scopeSchema.safeParse({ temperatureMinK: 300, temperatureMaxK: 10 });
    expect(window.success).toBe(false);
    expect(window.error?.issues[0].path).toEqual(['temperatureMaxK']);
    expect(scopeSchema.safeParse({ techniques: ['xrd'] }).error?.issues[0].path).toEqual(['techniques', 0]);
    expect(rulesSchema.safeParse({ bandEdgesCm1: [500, 200] }).success).toBe(false);
    expect(benchmarkDefinitionSchema.safeParse({ name: '  ' }).error?.issues[0].path).toEqual(['name']);
  });

  it('lower-cases material tags as material_tag stores them', () => {
    expect(scopeSchema.parse({ materialTags: [' Oxide '] }).materialTags).toEqual(['oxide']);
  });
});

describe('CSV cells', () => {
  it('neutralises formula triggers and keeps numbers numeric', () => {
    for (const trigger of ['=1+1', '+A1', '-A1', '@SUM(A1)', '\tx', '\rx']) expect(csvCell(trigger).replace(/^"/, '').startsWith("'")).toBe(true);
    expect(csvCell(-12.5)).toBe('-12.5');
    // a number kept as its original text stays a number
    expect(csvCell('-1.50')).toBe('-1.50');
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell(null)).toBe('');
    expect(toCsv(['a', 'b'], [[1, '=x']])).toBe("a,b\r\n1,'=x\r\n");
  });
});

describe('frequency bands', () => {
  it('labels measured values by the band edges', () => {
    expect(bandOf(150, [200, 500])).toBe('< 200');
    expect(bandOf(200, [200, 500])).toBe('200–500');
    expect(bandOf(900, [200, 500])).toBe('≥ 500');
  });
});

describe('alert thresholds per quantity', () => {
  it('default to 0.5 cm⁻¹ for frequencies and 0.2 J mol⁻¹ K⁻¹ for entropies; maeCm1 is an accepted alias', async () => {
    const { readAlertThresholds } = await import('@/lib/benchmark/schemas');
    expect(readAlertThresholds({}, 'frequency').maeAbsolute).toBe(0.5);
    // Before, an entropy benchmark used maeCm1 = 0.5 read as J mol⁻¹ K⁻¹.
    expect(readAlertThresholds({}, 'entropy').maeAbsolute).toBe(0.2);
    expect(readAlertThresholds({ maeCm1: 1.5 }, 'entropy').maeAbsolute).toBe(1.5);
    expect(readAlertThresholds({ maeAbsolute: 0.3, maeCm1: 1.5 }, 'entropy')).toMatchObject({ maeAbsolute: 0.3, maeCm1: 0.3 });
  });
});
