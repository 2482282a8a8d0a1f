import { describe, expect, it } from 'vitest';
import { alertMail, digestMail, type AlertContent } from '@/lib/alerts/alert-mail';
import { summarizeShift } from '@/lib/alerts/shift-summary';
import { method, pair, snapshot } from './fixtures';

function content(name = 'Oxides <script>alert(1)</script> & co'): AlertContent {
  const before = snapshot([method('a', 'PBEsol', 10, 4), method('b', 'r2"SCAN', 10, 5)]);
  const after = snapshot([method('a', 'PBEsol', 12, 6.125), method('b', 'r2"SCAN', 10, 5)], [pair('a', 'mat-1|A1g', 40, 'modified z 6.0 > 3.5')]);
  return {
    to: 'lead@example.org',
    recipientName: 'Mira <b>',
    baseUrl: 'https://ledger.example.org/',
    workspace: { name: 'Halden', slug: 'halden-phonons' },
    benchmark: { id: 'bm-1', name },
    fromRevision: 3,
    toRevision: { number: 5, createdAt: new Date('2026-03-01T10:00:00Z') },
    summary: summarizeShift(before, after, { maeCm1: 0.5, maeRelative: 0.05, nRelative: 0.1 }),
    materialNames: { 'mat-1': 'MgO' },
    imports: [{ fileName: 'raman-<oxides>.csv', by: 'Lena Okafor', rows: 2 }],
    unsubscribeToken: 'w-1.1900000000.' + 'x'.repeat(43),
    dedupeKey: 'alert:w-1:rev-5',
  };
}

describe('alert e-mail', () => {
  it('says which benchmark, the MAE before → after with the change, N, ranks, the imports and the links', () => {
    const mail = alertMail(content('Γ-point frequencies'));
    expect(mail.subject).toBe('Benchmark shifted: Γ-point frequencies (revision 5)');
    expect(mail.kind).toBe('alert');
    expect(mail.dedupeKey).toBe('alert:w-1:rev-5');
    expect(mail.textBody).toMatch(/PBEsol\s+4\.00 → 6\.13\s+\+2\.13 cm⁻¹ \(\+53\.1 %\)\s+10 → 12\s+1 → 2/);
    expect(mail.textBody).toContain('revision 3 → 5');
    expect(mail.textBody).toContain('raman-<oxides>.csv — Lena Okafor (2 rows in scope)');
    expect(mail.textBody).toContain('https://ledger.example.org/w/halden-phonons/benchmarks/bm-1/revisions/5');
    expect(mail.textBody).toContain('https://ledger.example.org/w/halden-phonons/benchmarks/bm-1/revisions/5#pair-mat-1%7CA1g');
    expect(mail.textBody).toContain('MgO A1g');
    expect(mail.textBody).toContain('https://ledger.example.org/unsubscribe?token=w-1.1900000000.');
  });

  it('carries the RFC 8058 one-click headers', () => {
    const mail = alertMail(content());
    expect(mail.headers).toEqual({
      'List-Unsubscribe': `<https://ledger.example.org/api/unsubscribe?token=w-1.1900000000.${'x'.repeat(43)}>`,
      'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
    });
  });

  it('escapes every value in the HTML', () => {
    const html = alertMail(content()).htmlBody;
    expect(html).not.toContain('<script>');
    expect(html).not.toContain('Mira <b>');
    expect(html).not.toContain('raman-<oxides>');
    expect(html).not.toContain('r2"SCAN');
    expect(html).toContain('Oxides &lt;script&gt;alert(1)&lt;/script&gt; &amp; co');
    expect(html).toContain('r2&quot;SCAN');
  });

  it('a digest lists the revisions of the day and compares the first and the last', () => {
    const mail = digestMail({
      ...content('Oxides'),
      dedupeKey: 'digest:w-1:2026-03-01',
      day: '2026-03-01',
      revisions: [
        { number: 4, createdAt: new Date('2026-03-01T09:00:00Z'), lines: ['PBEsol: MAE 4.00 → 5.00 cm⁻¹'] },
        { number: 5, createdAt: new Date('2026-03-01T10:00:00Z'), lines: [] },
      ],
    });
    expect(mail.kind).toBe('digest');
    expect(mail.subject).toBe('Daily digest: Oxides (2026-03-01)');
    expect(mail.textBody).toContain('2 new revisions, revision 3 → 5');
    expect(mail.textBody).toContain('Revision 4 · 2026-03-01 09:00 UTC');
    expect(mail.textBody).toContain('PBEsol: MAE 4.00 → 5.00 cm⁻¹');
    expect(mail.textBody).toContain('no change beyond the thresholds');
    expect(mail.headers?.['List-Unsubscribe-Post']).toBe('List-Unsubscribe=One-Click');
  });
});
