import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { execSync } from 'node:child_process';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

function chromiumPath(): string {
  if (process.env.CHROMIUM_PATH) return process.env.CHROMIUM_PATH;
  try {
    return execSync('command -v chromium || command -v chromium-browser', { encoding: 'utf8', shell: '/bin/sh' }).trim();
  } catch {
    throw new Error("Debian's chromium is missing: apt-get install -y chromium");
  }
}

/** A fresh browser profile in Debian's Chromium (never a downloaded browser). */
export async function newBrowser(): Promise<BrowserContext> {
  return chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'ledger-chrome-')), {
    executablePath: chromiumPath(),
    headless: true,
    viewport: { width: 1360, height: 900 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

export async function screenshot(page: Page, name: string) {
  const dir = join(process.cwd(), 'test-results');
  await page.screenshot({ path: join(dir, `${name}.png`), fullPage: true });
}

/**
 * Collects Content-Security-Policy violations on a page: the `securitypolicyviolation`
 * events the document fires (recorded by an init script, which CSP does not block) and
 * the console errors Chromium prints for them. Call before the page navigates.
 */
export async function collectCspViolations(page: Page): Promise<() => Promise<string[]>> {
  const fromConsole: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error' && /Content[ -]Security[ -]Policy|unsafe-eval|unsafe-inline/i.test(m.text())) fromConsole.push(m.text());
  });
  await page.addInitScript(() => {
    const seen: string[] = [];
    (window as unknown as { __cspViolations: string[] }).__cspViolations = seen;
    document.addEventListener('securitypolicyviolation', (e) => seen.push(`${e.violatedDirective} blocked ${e.blockedURI || '(inline)'} at ${e.sourceFile}:${e.lineNumber}`));
  });
  return async () => {
    const fromEvents = await page.evaluate(() => (window as unknown as { __cspViolations?: string[] }).__cspViolations ?? []).catch(() => []);
    return [...fromEvents, ...fromConsole];
  };
}
