import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';

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
