/** The minutes of a date range as Markdown: decisions and resolved threads, every user text escaped. */

export interface MinutesDecision {
  id: string;
  kind: 'exclude-pair' | 'exclude-measurement' | 'keep';
  benchmarkName: string | null;
  methodLabel: string | null;
  subject: string;
  reason: string;
  by: string | null;
  at: Date;
  revertedAt: Date | null;
  threadUrl: string | null;
}

export interface MinutesThread {
  id: string;
  subject: string;
  benchmarkName: string | null;
  resolvedBy: string | null;
  resolvedAt: Date;
  url: string | null;
  comments: Array<{ author: string | null; at: Date; body: string }>;
}

export interface MinutesInput {
  workspaceName: string;
  from: Date;
  to: Date;
  decisions: MinutesDecision[];
  threads: MinutesThread[];
}

/**
 * Escapes text for inline Markdown: characters with Markdown meaning get a
 * backslash, angle brackets and ampersands become entities (no raw HTML), and
 * line breaks become spaces (a field cannot start a heading or a list).
 */
export function escapeMarkdown(text: string): string {
  return text
    .replace(/\r\n?|\n/g, ' ')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/[\\`*_{}[\]()#+\-.!|~]/g, '\\$&');
}

/** A multi-line body as a Markdown blockquote, each line escaped. */
export function quoteMarkdown(text: string): string {
  return text
    .split(/\r\n?|\n/)
    .map((line) => `> ${escapeMarkdown(line)}`.trimEnd())
    .join('\n');
}

/** A link only to an absolute http(s) URL; its text escaped, its target percent-safe. */
function link(text: string, url: string | null): string {
  if (!url || !/^https?:\/\//i.test(url)) return escapeMarkdown(text);
  return `[${escapeMarkdown(text)}](<${encodeURI(decodeURI(url)).replace(/[<>]/g, encodeURIComponent)}>)`;
}

const day = (d: Date) => d.toISOString().slice(0, 10);
const minute = (d: Date) => d.toISOString().replace('T', ' ').slice(0, 16) + ' UTC';

const KIND: Record<MinutesDecision['kind'], string> = {
  'exclude-pair': 'Excluded pair',
  'exclude-measurement': 'Excluded measurement (every method)',
  keep: 'Kept',
};

export function minutesMarkdown(input: MinutesInput): string {
  const lines: string[] = [`# Minutes — ${escapeMarkdown(input.workspaceName)}`, '', `${day(input.from)} to ${day(input.to)}`, ''];
  lines.push(`## Decisions (${input.decisions.length})`, '');
  if (input.decisions.length === 0) lines.push('No decision was recorded in this period.', '');
  for (const d of input.decisions) {
    const where = [d.benchmarkName, d.methodLabel].filter(Boolean).map((s) => escapeMarkdown(s!)).join(' · ');
    lines.push(
      `- **${KIND[d.kind]}**: ${escapeMarkdown(d.subject)}${where ? ` (${where})` : ''} — “${escapeMarkdown(d.reason)}” · ${escapeMarkdown(d.by ?? 'unknown')}, ${minute(d.at)}` +
        (d.revertedAt ? ` · reverted ${minute(d.revertedAt)}` : '') +
        (d.threadUrl ? ` · ${link('discussion', d.threadUrl)}` : ''),
    );
  }
  if (input.decisions.length) lines.push('');
  lines.push(`## Resolved threads (${input.threads.length})`, '');
  if (input.threads.length === 0) lines.push('No thread was resolved in this period.', '');
  for (const t of input.threads) {
    lines.push(`### ${link(t.subject, t.url)}${t.benchmarkName ? ` — ${escapeMarkdown(t.benchmarkName)}` : ''}`, '');
    lines.push(`Resolved by ${escapeMarkdown(t.resolvedBy ?? 'unknown')}, ${minute(t.resolvedAt)}.`, '');
    for (const c of t.comments) {
      lines.push(`**${escapeMarkdown(c.author ?? 'unknown')}**, ${minute(c.at)}:`, '', quoteMarkdown(c.body), '');
    }
  }
  return lines.join('\n').replace(/\n{3,}/g, '\n\n').trimEnd() + '\n';
}
