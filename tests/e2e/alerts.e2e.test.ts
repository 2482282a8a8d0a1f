/**
 * Watches and alerts, end to end on the demo workspace: the curator watches the
 * demo benchmark, the contributor imports measurements through the import route,
 * and the alert that reaches the local mail fake carries the MAE the benchmark
 * page shows before and after. The imported values are invented re-measurements
 * (demo only), shifted on purpose to move the statistics.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createClient } from '@libsql/client';
import type { BrowserContext, Page } from 'playwright-core';
import { newBrowser, screenshot } from './support/browser';
import { waitForMail } from './support/mailbox';

const base = inject('baseURL');
const mailURL = inject('mailURL');
const databaseURL = inject('databaseURL');

const group = JSON.parse(readFileSync(new URL('../../data/demo/group.json', import.meta.url), 'utf8')) as {
  password: string;
  workspace: { slug: string };
  members: Array<{ email: string; role: string }>;
};
const slug = group.workspace.slug;
const curator = group.members.find((m) => m.role === 'curator')!.email;
const contributor = group.members.find((m) => m.role === 'contributor')!.email;
const BENCHMARK = 'Γ-point frequencies — all methods (demo)';
const SUBJECT = /^Benchmark shifted: Γ-point frequencies — all methods \(demo\)/;

const HEADER = 'material,quantity,value,unit,uncertainty,temperature_K,irrep,technique,source,notes';
const NOTE = 'invented re-measurement for the alert test (demo only)';
/** −15 % on single-line Raman modes (of the values in data/demo/modes.csv): every method's error grows on these pairs. */
const SHIFTING = [
  ['Si', 442.4],
  ['Ge', 255.6],
  ['C-diamond', 1132.8],
  ['CaF2', 273.7],
  ['SrF2', 230.9],
  ['BaF2', 217.2],
  ['CeO2', 379.4],
]
  .map(([material, value]) => `${material},frequency,${value},cm-1,0.1,295,T2g,raman,demo-invented-2026,${NOTE}`)
  .join('\n');
/** One line 0.5 cm⁻¹ from the value already measured: a typical error, nothing meaningful. */
const QUIET = `TiO2-rutile,frequency,643.1,cm-1,1,295,A1g,raman,demo-invented-2026,${NOTE}`;
const SHIFTING_AGAIN = [
  ['Eg', 399.0],
  ['B1g', 127.7],
  ['B2g', 737.2],
]
  // 80 K: a spectrum of its own, so these lines pair instead of competing with the 295 K ones
  .map(([irrep, value]) => `TiO2-rutile,frequency,${value},cm-1,0.1,80,${irrep},raman,demo-invented-2026,${NOTE}`)
  .join('\n');

let browser: BrowserContext;
let page: Page;
let workspaceId: string;
let benchmarkId: string;
let contributorCookie: string;

interface Row {
  label: string;
  n: string;
  mae: string;
}

interface FakeMessage {
  to: string[];
  subject: string;
  text?: string;
  headers?: Record<string, string>;
}

async function alertsFor(email: string): Promise<FakeMessage[]> {
  const { messages } = (await (await fetch(`${mailURL}/__mailbox`)).json()) as { messages: FakeMessage[] };
  return messages.filter((m) => m.to.includes(email) && SUBJECT.test(m.subject));
}

async function signInBrowser(email: string) {
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(group.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${base}/w`);
}

async function signInApi(email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password: group.password }),
  });
  expect(res.status).toBe(200);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

async function importCsv(rows: string, fileName: string) {
  const res = await fetch(`${base}/api/workspaces/${workspaceId}/imports?kind=measurements&fileName=${encodeURIComponent(fileName)}`, {
    method: 'POST',
    headers: { cookie: contributorCookie, origin: base, 'content-type': 'text/csv' },
    body: `${HEADER}\n${rows}\n`,
  });
  expect(res.status, await res.clone().text()).toBe(201);
}

async function revisionNumber(): Promise<number> {
  const res = await page.request.get(`${base}/api/workspaces/${workspaceId}/benchmarks/${benchmarkId}/statistics`);
  expect(res.status()).toBe(200);
  const body = (await res.json()) as { revision: { number: number } | null };
  return body.revision?.number ?? 0;
}

async function waitForRevisionAfter(number: number, timeoutMs = 45_000): Promise<number> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const now = await revisionNumber();
    if (now > number) return now;
    if (Date.now() > deadline) expect.fail(`no revision after ${number} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 300));
  }
}

/** The leaderboard as the benchmark page shows it (methods with an MAE). */
async function leaderboard(): Promise<Row[]> {
  await page.goto(`${base}/w/${slug}/benchmarks/${benchmarkId}`);
  const rows = page.getByTestId('leaderboard').locator('tbody tr[data-method]');
  await rows.first().waitFor();
  const out: Row[] = [];
  for (const row of await rows.all()) {
    const mae = row.locator('td[data-stat="mae"] strong');
    if ((await mae.count()) === 0) continue;
    out.push({ label: (await row.getAttribute('data-method'))!, n: (await row.locator('td[data-stat="n"]').innerText()).trim(), mae: (await mae.innerText()).trim() });
  }
  return out;
}

/** The alert's table line of one method: its label, then columns separated by two or more spaces. */
function alertLine(text: string, label: string): string {
  const line = text.split('\n').find((l) => l.replace(/^\*?\s+/, '').startsWith(`${label}  `));
  if (!line) expect.fail(`no line for ${label} in the alert:\n${text}`);
  return line;
}

beforeAll(async () => {
  const db = createClient({ url: databaseURL });
  const ws = await db.execute({ sql: 'select id from organization where slug = ?', args: [slug] });
  workspaceId = String(ws.rows[0].id);
  const bm = await db.execute({ sql: 'select id from benchmark where workspace_id = ? and name = ? and retracted_at is null', args: [workspaceId, BENCHMARK] });
  benchmarkId = String(bm.rows[0].id);
  db.close();
  browser = await newBrowser();
  page = await browser.newPage();
  contributorCookie = await signInApi(contributor);
});
afterAll(async () => {
  await browser?.close();
});

describe('watches and alerts', () => {
  let before: Row[];
  let firstRevision: number;
  let alert: FakeMessage;

  it('the curator watches the demo benchmark', async () => {
    await signInBrowser(curator);
    firstRevision = await waitForRevisionAfter(0);
    await page.goto(`${base}/w/${slug}/benchmarks/${benchmarkId}`);
    await page.getByRole('button', { name: 'Watch', exact: true }).click();
    await page.getByText('Watching · alerts').waitFor();
    before = await leaderboard();
    expect(before.length).toBeGreaterThan(0);
    await screenshot(page, 'alerts-watching');
  });

  it('an import that moves the MAE sends exactly one alert, with the numbers the page shows', async () => {
    expect(await alertsFor(curator)).toHaveLength(0);
    await importCsv(SHIFTING, 'raman-remeasured-e2e.csv');
    const revision = await waitForRevisionAfter(firstRevision);
    alert = (await waitForMail(mailURL, curator, SUBJECT, 45_000)) as FakeMessage;
    const after = await leaderboard();

    const text = (await alertsFor(curator))[0].text!;
    expect(text).toContain(`revision ${firstRevision} → ${revision}`);
    // the alert names its cause: the import, who made it, and its share of the change
    expect(text).toContain('Import “raman-remeasured-e2e.csv” by Lena Okafor');
    expect(text).toContain(`${base}/w/${slug}/benchmarks/${benchmarkId}/revisions/${revision}`);
    let moved = 0;
    for (const now of after) {
      const was = before.find((r) => r.label === now.label);
      if (!was) continue;
      const line = alertLine(text, now.label);
      expect(line).toContain(`${was.mae} → ${now.mae}`);
      expect(line).toContain(`${was.n} → ${now.n}`);
      const change = Number(now.mae) - Number(was.mae);
      if (Math.abs(change) > 0.5 && Math.abs(change) > 0.05 * Number(was.mae)) moved++;
    }
    expect(moved, 'the import should move at least one MAE beyond the default thresholds').toBeGreaterThan(0);

    const [delivered] = await alertsFor(curator);
    expect(delivered.headers?.['List-Unsubscribe']).toMatch(new RegExp(`^<${base}/api/unsubscribe\\?token=[^>]+>$`));
    expect(delivered.headers?.['List-Unsubscribe-Post']).toBe('List-Unsubscribe=One-Click');
    // the debounce window passes without a second copy
    await new Promise((r) => setTimeout(r, 3_000));
    expect(await alertsFor(curator)).toHaveLength(1);

    await page.goto(`${base}/w/${slug}/watches`);
    await page.getByTestId('alert-log').getByText(SUBJECT).waitFor();
    await screenshot(page, 'alerts-watches-page');
  });

  it('an import that changes nothing meaningful sends nothing', async () => {
    const revision = await revisionNumber();
    await importCsv(QUIET, 'raman-quiet-e2e.csv');
    await waitForRevisionAfter(revision);
    // recompute debounce + alert debounce (1.5 s) + a few worker passes
    await new Promise((r) => setTimeout(r, 6_000));
    expect(await alertsFor(curator)).toHaveLength(1);
  });

  it('the unsubscribe link stops further alerts', async () => {
    const link = alert.text?.match(/Stop these alerts \(one click, no sign-in\): (\S+)/)?.[1];
    expect(link).toBeDefined();
    await page.goto(link!);
    await page.getByRole('heading', { name: `Unsubscribe from ${BENCHMARK}?` }).waitFor();
    await page.getByRole('button', { name: 'Unsubscribe' }).click();
    await page.getByRole('heading', { name: 'Unsubscribed' }).waitFor();
    await screenshot(page, 'alerts-unsubscribed');

    const was = await leaderboard();
    const revision = await revisionNumber();
    await importCsv(SHIFTING_AGAIN, 'raman-remeasured-again-e2e.csv');
    await waitForRevisionAfter(revision);
    await new Promise((r) => setTimeout(r, 6_000));
    const now = await leaderboard();
    // the import did move the benchmark, yet no alert came
    expect(now.some((r) => Math.abs(Number(r.mae) - Number(was.find((w) => w.label === r.label)?.mae ?? r.mae)) > 0.5)).toBe(true);
    expect(await alertsFor(curator)).toHaveLength(1);

    // a forged link changes nothing and says so
    const [watchId, expires, signature] = decodeURIComponent(new URL(link!).searchParams.get('token')!).split('.');
    const forged = `${watchId}.${expires}.${signature[0] === 'A' ? 'B' : 'A'}${signature.slice(1)}`;
    await page.goto(`${base}/unsubscribe?token=${encodeURIComponent(forged)}`);
    await page.getByText(/not valid\. Nothing was changed/).waitFor();
  });
});
