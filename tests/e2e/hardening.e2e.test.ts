// The hardening rules seen from outside, against the server the scripts start (scripts/server.mjs).
import { networkInterfaces } from 'node:os';
import { connect } from 'node:net';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { newBrowser } from './support/browser';
import { DEMO_SLUG, demoUser } from './support/demo';

const base = inject('baseURL');
const port = Number(new URL(base).port);

let browser: BrowserContext;
let page: Page;
beforeAll(async () => {
  browser = await newBrowser();
  page = await browser.newPage();
});
afterAll(async () => {
  await browser?.close();
});

function reachable(host: string): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = connect({ host, port, timeout: 2000 });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
    socket.once('timeout', () => {
      socket.destroy();
      resolve(false);
    });
  });
}

describe('the server', () => {
  it('listens on 127.0.0.1 only when HOST is not set', async () => {
    expect(await reachable('127.0.0.1')).toBe(true);
    const external = Object.values(networkInterfaces())
      .flat()
      .filter((a) => a && a.family === 'IPv4' && !a.internal)
      .map((a) => a!.address);
    // A machine without another interface has nothing more to show.
    for (const address of external) expect(await reachable(address), `reachable on ${address}`).toBe(false);
  });

  it('shows the mailbox to this machine, and not through a proxy; a forged peer stamp changes nothing', async () => {
    expect((await fetch(`${base}/dev/mailbox`)).status).toBe(200);
    expect((await fetch(`${base}/dev/mailbox`, { headers: { 'x-forwarded-for': '203.0.113.5' } })).status).toBe(404);
    expect((await fetch(`${base}/dev/mailbox`, { headers: { 'x-ledger-peer': 'guess 203.0.113.5 direct' } })).status).toBe(200);
  });

  it('answers GET /api/health with the database and the job queue', async () => {
    const res = await fetch(`${base}/api/health`);
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ status: 'ok', database: { status: 'ok' }, mailWorker: { status: 'running' }, recomputeQueue: { status: 'ok' } });
  });
});

describe('in the browser', () => {
  it('does not follow next= to another host after sign-in (/%09/evil.example)', async () => {
    const owner = demoUser('owner');
    await page.goto(`${base}/sign-in?next=/%09/evil.example/x`);
    await page.getByLabel('E-mail').fill(owner.email);
    await page.getByLabel('Password').fill(owner.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${base}/w`);
    expect(new URL(page.url()).origin).toBe(base);
  });

  it('members: an invalid address shows its error and clears the earlier success', async () => {
    await page.goto(`${base}/w/${DEMO_SLUG}/settings/members`);
    const form = page.getByRole('form', { name: 'Invite a member' });
    await form.getByLabel('E-mail').fill(`guest.${Date.now()}@example.org`);
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await form.getByText(/Invitation sent to/).waitFor();
    await form.getByLabel('E-mail').fill('not-an-address');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await form.getByText('Enter a valid e-mail address.').waitFor();
    expect(await form.getByText(/Invitation sent to/).count()).toBe(0);
  });

  it('sign-up states the password rule and refuses a common password at the field', async () => {
    await page.context().clearCookies();
    await page.goto(`${base}/sign-up`);
    await page.getByText('not one of the most common passwords').first().waitFor();
    await page.getByLabel('Name').fill('Common Pat');
    await page.getByLabel('E-mail').fill(`pat.${Date.now()}@example.org`);
    await page.getByLabel('Password').fill('password123');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText(/one of the most common ones/).waitFor();
    expect(await page.getByRole('heading', { name: 'Check your e-mail' }).count()).toBe(0);
  });
});
