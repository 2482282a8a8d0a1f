import { describe, expect, it } from 'vitest';
import { escapeMarkdown, minutesMarkdown, quoteMarkdown } from '@/lib/discussion/minutes';
import { parseDateRange } from '@/lib/discussion/date-range';

describe('minutes as Markdown', () => {
  it('escapes Markdown syntax, HTML and line breaks in user text', () => {
    expect(escapeMarkdown('**bold** [x](javascript:1) <script>')).toBe('\\*\\*bold\\*\\* \\[x\\]\\(javascript:1\\) &lt;script&gt;');
    expect(escapeMarkdown('a\n# heading')).toBe('a \\# heading');
    expect(quoteMarkdown('one\n- two')).toBe('> one\n> \\- two');
  });

  it('lists decisions and resolved threads of the range', () => {
    const md = minutesMarkdown({
      workspaceName: 'Halden <demo>',
      from: new Date('2026-03-01T00:00:00Z'),
      to: new Date('2026-03-07T23:59:59Z'),
      decisions: [
        {
          id: 'd1',
          kind: 'exclude-pair',
          benchmarkName: 'Γ-point',
          methodLabel: 'PBEsol',
          subject: 'GaN E2(high)',
          reason: 'strained film',
          by: 'Tomas',
          at: new Date('2026-03-03T10:00:00Z'),
          revertedAt: null,
          threadUrl: 'https://ledger.example.org/w/x/benchmarks/b#discussion',
        },
      ],
      threads: [
        {
          id: 't1',
          subject: 'GaN E2(high)',
          benchmarkName: null,
          resolvedBy: 'Tomas',
          resolvedAt: new Date('2026-03-04T09:00:00Z'),
          url: 'javascript:alert(1)',
          comments: [{ author: 'Lena', at: new Date('2026-03-03T09:00:00Z'), body: 'measured on a <b>strained</b> film\n@tomas' }],
        },
      ],
    });
    expect(md).toContain('# Minutes — Halden &lt;demo&gt;');
    expect(md).toContain('2026-03-01 to 2026-03-07');
    expect(md).toContain('- **Excluded pair**: GaN E2\\(high\\) (Γ\\-point · PBEsol) — “strained film” · Tomas, 2026-03-03 10:00 UTC · [discussion](<https://ledger.example.org/w/x/benchmarks/b#discussion>)');
    // a non-http URL is never a link
    expect(md).toContain('### GaN E2\\(high\\)\n');
    expect(md).toContain('> measured on a &lt;b&gt;strained&lt;/b&gt; film\n> @tomas');
    expect(md).not.toMatch(/<b>|<script>|\]\(javascript/);
  });

  it('says so when nothing happened', () => {
    const md = minutesMarkdown({ workspaceName: 'W', from: new Date('2026-01-01T00:00:00Z'), to: new Date('2026-01-02T00:00:00Z'), decisions: [], threads: [] });
    expect(md).toContain('No decision was recorded in this period.');
    expect(md).toContain('No thread was resolved in this period.');
  });
});

describe('date range', () => {
  it('defaults to the last seven days and includes the end day', () => {
    const r = parseDateRange(undefined, undefined, new Date('2026-03-10T15:00:00Z'));
    expect(r).toMatchObject({ ok: true, fromText: '2026-03-04', toText: '2026-03-10' });
    if (r.ok) expect(r.to.toISOString()).toBe('2026-03-11T00:00:00.000Z');
  });

  it('refuses malformed, impossible and reversed dates with what is wrong', () => {
    expect(parseDateRange('03/01/2026', '2026-03-02')).toEqual({ ok: false, message: '"from" must be a date written YYYY-MM-DD, got "03/01/2026".' });
    expect(parseDateRange('2026-02-30', '2026-03-02')).toEqual({ ok: false, message: '"from" is not a calendar date: "2026-02-30".' });
    expect(parseDateRange('2026-03-05', '2026-03-02')).toMatchObject({ ok: false, message: expect.stringContaining('before') });
  });
});
