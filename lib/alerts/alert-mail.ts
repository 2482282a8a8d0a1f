/**
 * The alert and digest e-mails: HTML and plain text from the same rows, every
 * value escaped, with the RFC 8058 one-click unsubscribe headers.
 */
import type { OutgoingMail } from '@/lib/mail/outgoing';
import { escapeHtml } from '@/lib/mail/templates';
import type { MethodShiftRow, ShiftSummary } from './shift-summary';
import { fixed, signed, stat, trueMinus, utcMinute } from '@/lib/format';

export interface AlertImport {
  fileName: string | null;
  by: string | null;
  rows: number;
}

export interface AlertContent {
  to: string;
  recipientName: string;
  /** Public origin of the app, e.g. https://ledger.example.org */
  baseUrl: string;
  workspace: { name: string; slug: string };
  benchmark: { id: string; name: string };
  /** Number of the revision last announced to this watcher (null: none yet). */
  fromRevision: number | null;
  toRevision: { number: number; createdAt: Date };
  summary: ShiftSummary;
  materialNames: Record<string, string>;
  imports: AlertImport[];
  /** Every cause between the two revisions, in words with its share (causes.ts); replaces `imports` when given. */
  causes?: { lines: string[]; rest: string | null };
  unsubscribeToken: string;
  dedupeKey: string;
}

export interface DigestContent extends AlertContent {
  /** The day the digest covers, YYYY-MM-DD (UTC). */
  day: string;
  /** Each revision of the period with its own changes in words. */
  revisions: Array<{ number: number; createdAt: Date; lines: string[] }>;
}

const f2 = (v: number | null) => stat('error', v);
const orDash = (v: number | null) => (v === null ? '—' : String(v));
const utc = (d: Date) => utcMinute(d);

export function alertLinks(c: Pick<AlertContent, 'baseUrl' | 'workspace' | 'benchmark' | 'toRevision' | 'unsubscribeToken'>) {
  const base = c.baseUrl.replace(/\/+$/, '');
  const benchmark = `${base}/w/${encodeURIComponent(c.workspace.slug)}/benchmarks/${encodeURIComponent(c.benchmark.id)}`;
  const token = encodeURIComponent(c.unsubscribeToken);
  return {
    revision: `${benchmark}/revisions/${c.toRevision.number}`,
    history: `${benchmark}#revision-history`,
    watches: `${base}/w/${encodeURIComponent(c.workspace.slug)}/watches`,
    unsubscribePage: `${base}/unsubscribe?token=${token}`,
    oneClick: `${base}/api/unsubscribe?token=${token}`,
  };
}

function rankText(r: MethodShiftRow): string {
  if (r.rankBefore === r.rankAfter) return orDash(r.rankAfter);
  return `${orDash(r.rankBefore)} → ${orDash(r.rankAfter)}`;
}

function changeText(r: MethodShiftRow, unit: string): string {
  if (r.maeChange === null) return r.maeBefore === null ? 'new' : 'gone';
  const pct = r.maeChangePercent === null ? '' : ` (${signed(r.maeChangePercent, 1)} %)`;
  return `${signed(r.maeChange)} ${unit}${pct}`;
}

function textTable(summary: ShiftSummary): string {
  const head = ['Method', `MAE before → after (${summary.unit})`, 'Change', 'N before → after', 'Rank'];
  const rows = summary.methods.map((r) => [
    (r.kinds.length ? '* ' : '  ') + r.label,
    `${f2(r.maeBefore)} → ${f2(r.maeAfter)}`,
    changeText(r, summary.unit),
    `${orDash(r.nBefore)} → ${orDash(r.nAfter)}`,
    rankText(r),
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i])).join('  ').trimEnd();
  return [line(head), ...rows.map(line), '(* = crossed a threshold)'].join('\n');
}

function htmlTable(summary: ShiftSummary): string {
  const th = 'style="text-align:left;padding:4px 8px;border-bottom:1px solid #ccc;font-weight:600"';
  const td = 'style="padding:4px 8px;border-bottom:1px solid #eee;font-variant-numeric:tabular-nums"';
  const head = ['Method', `MAE before → after (${summary.unit})`, 'Change', 'N before → after', 'Rank'].map((h) => `<th ${th}>${escapeHtml(h)}</th>`).join('');
  const rows = summary.methods
    .map((r) => {
      const cells = [r.label, `${f2(r.maeBefore)} → ${f2(r.maeAfter)}`, changeText(r, summary.unit), `${orDash(r.nBefore)} → ${orDash(r.nAfter)}`, rankText(r)];
      const weight = r.kinds.length ? 'font-weight:600;' : 'color:#555;';
      return `<tr style="${weight}">${cells.map((c) => `<td ${td}>${escapeHtml(c)}</td>`).join('')}</tr>`;
    })
    .join('');
  return `<table style="border-collapse:collapse;font-size:13px;margin:8px 0 16px" data-alert="methods"><thead><tr>${head}</tr></thead><tbody>${rows}</tbody></table>`;
}

function outlierLines(c: AlertContent, revisionUrl: string): Array<{ text: string; url: string }> {
  return c.summary.newOutliers.map((o) => ({
    text: `${o.methodLabel}, ${c.materialNames[o.materialId] ?? 'a material'}${o.label ? ` ${o.label}` : ''}: measured ${fixed(o.measured, 2)}, calculated ${fixed(o.calculated, 2)}, error ${signed(o.error)} ${c.summary.unit} (${trueMinus(o.reason)})`,
    url: `${revisionUrl}#pair-${encodeURIComponent(o.pairKey)}`,
  }));
}

function importLines(c: AlertContent): string[] {
  return c.imports.map((i) => `${i.fileName ?? 'an import without a file name'} — ${i.by ?? 'unknown'} (${i.rows} row${i.rows === 1 ? '' : 's'} in scope)`);
}

function causeSection(c: AlertContent, historyUrl: string): { text: string[]; html: string } {
  const a = (label: string, url: string) => `<a href="${escapeHtml(url)}">${escapeHtml(label)}</a>`;
  if (c.causes) {
    const head = c.fromRevision === null ? 'What changed' : `What changed since revision ${c.fromRevision}`;
    const rest = c.causes.rest ? [`${c.causes.rest} The revision history lists them all: ${historyUrl}`] : [];
    return {
      text: [`${head}:`, [...c.causes.lines, ...rest].map((l) => `- ${l}`).join('\n')],
      html: `<h2 style="font-size:14px">${escapeHtml(head)}</h2><ul>${c.causes.lines.map((l) => `<li>${escapeHtml(l)}</li>`).join('')}${
        c.causes.rest ? `<li>${escapeHtml(c.causes.rest)} ${a('The revision history lists them all', historyUrl)}.</li>` : ''
      }</ul>`,
    };
  }
  const imports = importLines(c);
  const none = 'No import caused it: a decision, a pin or a change of the benchmark did.';
  return imports.length
    ? { text: ['Caused by these imports:', imports.map((l) => `- ${l}`).join('\n')], html: `<h2 style="font-size:14px">Caused by these imports</h2><ul>${imports.map((l) => `<li>${escapeHtml(l)}</li>`).join('')}</ul>` }
    : { text: [none], html: `<p style="margin:0 0 12px">${escapeHtml(none)}</p>` };
}

function render(c: AlertContent, title: string, intro: string, extra: { text: string[]; html: string }): { text: string; html: string } {
  const links = alertLinks(c);
  const outliers = outlierLines(c, links.revision);
  const causes = causeSection(c, links.history);
  const p = (s: string) => `<p style="margin:0 0 12px">${escapeHtml(s)}</p>`;
  const a = (label: string, url: string) => `<a href="${escapeHtml(url)}">${escapeHtml(label)}</a>`;

  const text = [
    `Hello ${c.recipientName},`,
    intro,
    textTable(c.summary),
    ...(outliers.length ? ['New outliers:', outliers.map((o) => `- ${o.text}\n  ${o.url}`).join('\n')] : []),
    ...causes.text,
    ...extra.text,
    `Revision ${c.toRevision.number}: ${links.revision}`,
    `Benchmark and revision history: ${links.history}`,
    `Your watches and thresholds: ${links.watches}`,
    `Stop these alerts (one click, no sign-in): ${links.unsubscribePage}`,
    '— Lattice Ledger',
  ].join('\n\n');

  const html = `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1a1a1a;max-width:720px;margin:24px auto;padding:0 16px"><h1 style="font-size:18px">${escapeHtml(title)}</h1>${p(`Hello ${c.recipientName},`)}${p(intro)}${htmlTable(c.summary)}${
    outliers.length ? `<h2 style="font-size:14px">New outliers</h2><ul>${outliers.map((o) => `<li>${a(o.text, o.url)}</li>`).join('')}</ul>` : ''
  }${causes.html}${extra.html}<p style="margin:16px 0">${a(`Open revision ${c.toRevision.number}`, links.revision)} · ${a('Benchmark and revision history', links.history)} · ${a('Your watches and thresholds', links.watches)}</p><hr style="border:none;border-top:1px solid #ddd;margin:24px 0"><p style="font-size:12px;color:#666">You get this because you watch “${escapeHtml(c.benchmark.name)}” in ${escapeHtml(c.workspace.name)}. ${a('Unsubscribe', links.unsubscribePage)} (one click, no sign-in).</p><p style="font-size:12px;color:#666">Lattice Ledger</p></body></html>`;
  return { text, html };
}

function unsubscribeHeaders(c: AlertContent): Record<string, string> {
  return { 'List-Unsubscribe': `<${alertLinks(c).oneClick}>`, 'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click' };
}

/** One immediate alert: baseline revision → latest revision. */
export function alertMail(c: AlertContent): OutgoingMail {
  const span = c.fromRevision === null ? `revision ${c.toRevision.number}` : `revision ${c.fromRevision} → ${c.toRevision.number}`;
  const intro = `“${c.benchmark.name}” (${c.workspace.name}) shifted: ${span}, computed ${utc(c.toRevision.createdAt)}.`;
  const { text, html } = render(c, `Benchmark shifted: ${c.benchmark.name}`, intro, { text: [], html: '' });
  return {
    kind: 'alert',
    toAddress: c.to,
    subject: `Benchmark shifted: ${c.benchmark.name} (revision ${c.toRevision.number})`,
    textBody: text,
    htmlBody: html,
    headers: unsubscribeHeaders(c),
    dedupeKey: c.dedupeKey,
  };
}

/** The daily digest: every revision of the period and the overall change. */
export function digestMail(c: DigestContent): OutgoingMail {
  const span = c.fromRevision === null ? `up to revision ${c.toRevision.number}` : `revision ${c.fromRevision} → ${c.toRevision.number}`;
  const intro = `Daily digest for “${c.benchmark.name}” (${c.workspace.name}), ${c.day}: ${c.revisions.length} new revision${c.revisions.length === 1 ? '' : 's'}, ${span}. The table compares the first and the last.`;
  const perRevision = c.revisions.map((r) => ({ head: `Revision ${r.number} · ${utc(r.createdAt)}`, lines: r.lines.length ? r.lines : ['no change beyond the thresholds'] }));
  const extra = {
    text: ['Revisions of the day:', perRevision.map((r) => `- ${r.head}\n${r.lines.map((l) => `    ${l}`).join('\n')}`).join('\n')],
    html: `<h2 style="font-size:14px">Revisions of the day</h2><ul>${perRevision
      .map((r) => `<li>${escapeHtml(r.head)}<ul>${r.lines.map((l) => `<li>${escapeHtml(l)}</li>`).join('')}</ul></li>`)
      .join('')}</ul>`,
  };
  const { text, html } = render(c, `Daily digest: ${c.benchmark.name}`, intro, extra);
  return {
    kind: 'digest',
    toAddress: c.to,
    subject: `Daily digest: ${c.benchmark.name} (${c.day})`,
    textBody: text,
    htmlBody: html,
    headers: unsubscribeHeaders(c),
    dedupeKey: c.dedupeKey,
  };
}
