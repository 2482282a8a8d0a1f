import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { newBrowser, screenshot } from './support/browser';
import { firstLink, waitForMail } from './support/mailbox';

const base = inject('baseURL');
const mailURL = inject('mailURL');
const stamp = Date.now();
const lead = { name: 'Ines Varga', email: `ines.${stamp}@example.org`, password: 'phonons-at-gamma-1' };
const colleague = { name: 'Jon Adeyemi', email: `jon.${stamp}@example.org`, password: 'raman-shift-520-si' };
const slug = `lab-${stamp}`;

let browser: BrowserContext;
let page: Page;

beforeAll(async () => {
  browser = await newBrowser();
  page = await browser.newPage();
});
afterAll(async () => {
  await browser?.close();
});

async function signUpAndVerify(user: typeof lead, next = '') {
  await page.goto(`${base}/sign-up${next ? `?next=${encodeURIComponent(next)}` : ''}`);
  await page.getByLabel('Name').fill(user.name);
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(user.password);
  await page.getByRole('button', { name: 'Create account' }).click();
  await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
  const mail = await waitForMail(mailURL, user.email, /Confirm your e-mail/);
  await page.goto(firstLink(mail.text));
}

async function signIn(user: typeof lead) {
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(user.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${base}/w`);
}

async function signOut() {
  await page.getByRole('button', { name: 'Sign out' }).first().click();
  await page.waitForURL(/\/sign-in/);
}

describe('sign-up, workspace, invitation, roles', () => {
  it('signs up with e-mail verification shown in the mailbox page, then creates a workspace', async () => {
    await page.goto(`${base}/sign-in`);
    await page.getByLabel('E-mail').fill('nobody@example.org');
    await page.getByLabel('Password').fill('wrong-password-123');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByRole('alert').first().textContent()).toMatch(/invalid/i);

    await signUpAndVerify(lead);
    await page.waitForURL(`${base}/w`);
    await page.goto(`${base}/dev/mailbox`);
    expect(await page.getByTestId('mailbox-item').filter({ hasText: 'Confirm your e-mail address' }).count()).toBeGreaterThan(0);

    await page.goto(`${base}/w`);
    await page.getByLabel('Name').fill('Lattice Dynamics Lab');
    await page.getByLabel('Address').fill(slug);
    await page.getByRole('button', { name: 'Create workspace' }).click();
    await page.waitForURL(`${base}/w/${slug}`);
    await page.getByText('You are owner').waitFor();
  });

  it('invites a colleague; the invitation arrives in the mailbox and is accepted by that address', async () => {
    await page.goto(`${base}/w/${slug}/settings/members`);
    const inviteForm = page.getByRole('form', { name: 'Invite a member' });
    await inviteForm.getByLabel('E-mail').fill(colleague.email);
    await inviteForm.getByLabel('Role').selectOption('contributor');
    await inviteForm.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText(`Invitation sent to ${colleague.email}`).waitFor();
    const invite = await waitForMail(mailURL, colleague.email, /Invitation to Lattice Dynamics Lab/);
    const inviteLink = firstLink(invite.text);

    await page.goto(`${base}/dev/mailbox`);
    await page.getByTestId('mailbox-item').filter({ hasText: 'Invitation to Lattice Dynamics Lab' }).first().click();
    await page.getByTestId('mailbox-message').getByText(colleague.email).first().waitFor();
    await screenshot(page, 'mailbox-invitation');

    await page.goto(`${base}/w/${slug}`);
    await signOut();
    await signUpAndVerify(colleague, new URL(inviteLink).pathname);
    await page.waitForURL(inviteLink);
    await page.getByText('You are invited to').waitFor();
    await page.getByRole('button', { name: 'Accept and join' }).click();
    await page.waitForURL(`${base}/w/${slug}`);
    await page.getByText('You are contributor').waitFor();
  });

  it('enforces roles: a contributor sees no member controls and cannot open another workspace', async () => {
    await page.goto(`${base}/w/${slug}/settings/members`);
    await page.getByTestId(`member-${lead.email}`).waitFor();
    expect(await page.getByRole('button', { name: 'Send invitation' }).count()).toBe(0);
    expect(await page.getByRole('combobox', { name: 'Role' }).count()).toBe(0);

    const other = await page.goto(`${base}/w/halden-phonons`);
    expect(other?.status()).toBe(404);
    await page.getByText('Not found').waitFor();
    await page.goto(`${base}/w/${slug}`);
    await signOut();
  });

  it('lets the owner change the colleague’s role', async () => {
    await signIn(lead);
    await page.goto(`${base}/w/${slug}/settings/members`);
    const row = page.getByTestId(`member-${colleague.email}`);
    await row.getByRole('combobox', { name: 'Role' }).selectOption('reviewer');
    await row.getByRole('button', { name: 'Save' }).click();
    await row.getByText('Saved').waitFor();
    await page.reload();
    expect(await page.getByTestId(`member-${colleague.email}`).getByRole('combobox', { name: 'Role' }).inputValue()).toBe('reviewer');
    await screenshot(page, 'members');
  });
});
