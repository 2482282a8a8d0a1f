import { describe, expect, it } from 'vitest';
import { alertMail, type AlertContent } from '@/lib/alerts/alert-mail';
import { MAX_LISTED_CAUSES, attributeCauses, causeLine, summariseCauses, type CauseLookups, type CauseStep } from '@/lib/alerts/causes';
import { summarizeShift } from '@/lib/alerts/shift-summary';
import { method, snapshot } from './fixtures';

const methods = (mae: number) => [{ methodId: 'a', label: 'PBEsol', statistics: { meanAbsoluteError: mae } }];
const empty: CauseLookups = { imports: new Map(), decisions: new Map(), pins: new Map(), users: new Map(), thresholdEdits: [] };
const cause = (over: Partial<NonNullable<CauseStep['cause']>>): NonNullable<CauseStep['cause']> => ({
  reported: [],
  rows: { measurementsAdded: 0, measurementsRemoved: 0, calculationsAdded: 0, calculationsRemoved: 0 },
  imports: [],
  decisions: { added: [], reverted: [] },
  pins: { added: [], revoked: [] },
  ...over,
});

describe('cause attribution', () => {
  it('gives each step its share of the headline MAE change (worked case: 4 → 5 → 8 → 7)', () => {
    const steps: CauseStep[] = [
      { number: 2, cause: cause({ imports: [{ id: 'i1', rows: 3 }] }), methods: methods(5) },
      { number: 3, cause: cause({ decisions: { added: ['d1'], reverted: [] } }), methods: methods(8) },
      { number: 4, cause: cause({ reported: [{ trigger: 'benchmark-updated', userId: 'u1' }], pins: { added: [], revoked: ['p1'] } }), methods: methods(7) },
    ];
    const lookups: CauseLookups = {
      ...empty,
      imports: new Map([['i1', { fileName: 'ir.csv', by: 'Dana' }]]),
      decisions: new Map([['d1', { kind: 'exclude-measurement', reason: 'wrong polytype', by: 'Ana', method: null }]]),
      pins: new Map([['p1', { reason: 'ambiguous', by: 'Ana', method: 'PBEsol', noCounterpart: false }]]),
      users: new Map([['u1', 'Ana']]),
      thresholdEdits: [{ by: 'Ana', at: new Date() }],
    };
    const { headline, causes } = attributeCauses(methods(4), steps, lookups);
    expect(headline).toMatchObject({ methodId: 'a', before: 4, after: 7 });
    // Δ = +1, +3, −1 of a total +3
    expect(causes.map((c) => [c.kind, c.share === null ? null : Number(c.share.toFixed(4))])).toEqual([
      ['decision', 1],
      ['import', 0.3333],
      ['definition', -0.3333],
      ['pin-revoked', -0.3333],
      ['thresholds', null],
    ]);
    expect(causeLine(causes[0], headline)).toBe("Decision by Ana: excluded a measurement for every method — “wrong polytype” — 100 % of PBEsol's MAE change (revision 3)");
    expect(causeLine(causes[2], headline)).toContain('shared with 1 other cause of revision 4');
    expect(causes[4].text).toContain('not the numbers');
  });

  it('names an undone import and a bare data change', () => {
    const steps: CauseStep[] = [
      { number: 2, cause: cause({ reported: [{ trigger: 'import-undone', importId: 'i9', userId: 'u1' }], rows: { measurementsAdded: 0, measurementsRemoved: 4, calculationsAdded: 0, calculationsRemoved: 0 } }), methods: methods(3) },
      { number: 3, cause: cause({ rows: { measurementsAdded: 2, measurementsRemoved: 0, calculationsAdded: 1, calculationsRemoved: 0 } }), methods: methods(2) },
    ];
    const { causes } = attributeCauses(methods(4), steps, { ...empty, imports: new Map([['i9', { fileName: 'old.csv', by: 'Dana' }]]), users: new Map([['u1', 'Ana']]) });
    expect(causes.map((c) => c.text)).toEqual(['Import “old.csv” undone by Ana: 4 rows left the scope', 'Data changed in scope (+2/−0 measurements, +1/−0 calculations)']);
    expect(causes.map((c) => c.share)).toEqual([0.5, 0.5]);
  });

  it('summarises 2,705 causing imports beyond a few, with a link to the revision history', () => {
    const imports = Array.from({ length: 2705 }, (_, i) => ({ id: `i${i}`, rows: 1 + (i % 3) }));
    const steps: CauseStep[] = [{ number: 2, cause: cause({ imports }), methods: methods(5) }];
    const { headline, causes } = attributeCauses(methods(4), steps, empty);
    const { listed, rest } = summariseCauses(causes);
    expect(listed).toHaveLength(MAX_LISTED_CAUSES);
    const rows = imports.slice(MAX_LISTED_CAUSES).reduce((s, i) => s + i.rows, 0);
    expect(rest).toBe(`…and 2,699 more: 2,699 imports (${rows.toLocaleString('en-GB')} rows).`);

    const before = snapshot([method('a', 'PBEsol', 10, 4)]);
    const after = snapshot([method('a', 'PBEsol', 12, 5)]);
    const content: AlertContent = {
      to: 'lead@example.org',
      recipientName: 'Mira',
      baseUrl: 'https://ledger.example.org',
      workspace: { name: 'Halden', slug: 'halden' },
      benchmark: { id: 'bm-1', name: 'Oxides' },
      fromRevision: 1,
      toRevision: { number: 2, createdAt: new Date('2026-03-01T10:00:00Z') },
      summary: summarizeShift(before, after, { maeAbsolute: 0.5, maeRelative: 0.05, nRelative: 0.1 }),
      materialNames: {},
      imports: [],
      causes: { lines: listed.map((c) => causeLine(c, headline)), rest },
      unsubscribeToken: 'w-1.1900000000.' + 'x'.repeat(43),
      dedupeKey: 'alert:w-1:rev-2',
    };
    const mail = alertMail(content);
    expect(mail.textBody).toContain('…and 2,699 more: 2,699 imports');
    expect(mail.textBody).toContain('The revision history lists them all: https://ledger.example.org/w/halden/benchmarks/bm-1#revision-history');
    // Before, the alert listed every import (345 KB for 2,705); now it stays small.
    expect(mail.textBody.length + mail.htmlBody.length).toBeLessThan(12_000);
  });
});
