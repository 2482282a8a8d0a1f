import { readFileSync } from 'node:fs';
import { afterAll, beforeAll } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { newBrowser } from './browser';

const group = JSON.parse(readFileSync('data/demo/group.json', 'utf8')) as {
  password: string;
  workspace: { slug: string };
  members: Array<{ email: string; role: string }>;
};

export const DEMO_SLUG = group.workspace.slug;
export const demoUser = (role: 'owner' | 'curator' | 'contributor' | 'reviewer') => ({
  email: group.members.find((m) => m.role === role)!.email,
  password: group.password,
});

export async function signInDemo(page: Page, base: string, role: 'owner' | 'curator' | 'contributor' | 'reviewer') {
  const user = demoUser(role);
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(user.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${base}/w`);
}

export async function signOut(page: Page) {
  await page.getByRole('button', { name: 'Sign out' }).first().click();
  await page.waitForURL(/\/sign-in/);
}

/**
 * A fresh browser signed in as a demo member for the tests of one file:
 * `const session = demoSession('curator')`, then `session.page` inside the tests.
 */
export function demoSession(role: 'owner' | 'curator' | 'contributor' | 'reviewer', base: string): { page: Page } {
  const session = {} as { page: Page; browser: BrowserContext };
  beforeAll(async () => {
    session.browser = await newBrowser();
    session.page = await session.browser.newPage();
    await signInDemo(session.page, base, role);
  });
  afterAll(async () => {
    await session.browser?.close();
  });
  return session;
}
