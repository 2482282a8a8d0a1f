import { chromium } from 'playwright-core';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
const base = 'http://localhost:3417';
const ctx = await chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'benchui-chrome-')), { executablePath: '/usr/bin/chromium', headless: true, viewport: { width: 1024, height: 900 }, args: ['--no-sandbox', '--disable-gpu'] });
const page = await ctx.newPage();
await page.goto(`${base}/sign-in`);
await page.getByLabel('E-mail').fill('tomas.ferreira@example.org');
await page.getByLabel('Password').fill('ledger-demo-2026');
await page.getByRole('button', { name: 'Sign in' }).click();
await page.waitForURL(`${base}/w`);
await page.goto(base + '/w/halden-phonons/benchmarks');
const href = await page.getByRole('link', { name: 'Γ-point frequencies — all methods (demo)' }).first().getAttribute('href');
for (const path of [href]) {
  await page.goto(base + path);
  await page.waitForTimeout(4000);
  const r = await page.evaluate(() => {
    const out = [];
    for (const el of document.querySelectorAll('body *')) {
      const b = el.getBoundingClientRect();
      if (b.right > window.innerWidth + 0.5 && b.width > 0) out.push(`${el.tagName}.${String(el.className).slice(0, 80)} right=${b.right} w=${b.width}`);
    }
    return { sw: document.documentElement.scrollWidth, out: out.slice(0, 15) };
  });
  console.log(path, JSON.stringify(r, null, 1));
}
await ctx.close();
