/** A [from, to) range of whole UTC days from "YYYY-MM-DD" inputs; `to` is inclusive for people. */
export type DateRange = { ok: true; from: Date; to: Date; fromText: string; toText: string } | { ok: false; message: string };

const DAY_MS = 86_400_000;
const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

function parseDay(text: string, name: string): Date | string {
  if (!ISO_DAY.test(text)) return `"${name}" must be a date written YYYY-MM-DD, got "${text.slice(0, 40)}".`;
  const d = new Date(`${text}T00:00:00Z`);
  if (Number.isNaN(d.getTime()) || d.toISOString().slice(0, 10) !== text) return `"${name}" is not a calendar date: "${text}".`;
  return d;
}

export function parseDateRange(fromText: string | null | undefined, toText: string | null | undefined, now = new Date()): DateRange {
  const today = now.toISOString().slice(0, 10);
  const f = fromText || new Date(now.getTime() - 6 * DAY_MS).toISOString().slice(0, 10);
  const t = toText || today;
  const from = parseDay(f, 'from');
  if (typeof from === 'string') return { ok: false, message: from };
  const to = parseDay(t, 'to');
  if (typeof to === 'string') return { ok: false, message: to };
  if (to < from) return { ok: false, message: `"to" (${t}) is before "from" (${f}).` };
  if (to.getTime() - from.getTime() > 366 * DAY_MS) return { ok: false, message: 'Choose a range of at most one year.' };
  return { ok: true, from, to: new Date(to.getTime() + DAY_MS), fromText: f, toText: t };
}
