import { randomUUID } from 'node:crypto';
import { createServer } from 'node:net';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import { ensureMailCatcher, type MailCatcher } from '../../server/ops/mail-catcher';
import {
  accessibilityViolations,
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

let ctx: BrowserContext;
let catcher: MailCatcher;
let webPort = 0;
beforeAll(async () => {
  // A mail catcher of this test's own, on free ports, and the app sending to it.
  const smtpPort = await freePort();
  webPort = await freePort();
  catcher = await ensureMailCatcher(smtpPort, webPort);
  ctx = await startBrowserTest({ SMTP_PORT: String(smtpPort) });
});
afterAll(async () => {
  await ctx?.close();
  catcher?.stop();
});

/** The one-time link in the newest message to this address, read from the catcher's inbox as the person would. */
async function linkMailedTo(email: string): Promise<string> {
  let token: string | undefined;
  await expect
    .poll(
      async () => {
        const inbox = (await (await fetch(`http://127.0.0.1:${webPort}/api/email`)).json()) as {
          to: { address: string }[];
          text: string;
        }[];
        const mine = inbox.filter((m) => m.to.some((t) => t.address === email));
        token = /\/set-password#([A-Za-z0-9_-]{43})/.exec(mine.at(-1)?.text ?? '')?.[1];
        return token;
      },
      { timeout: 20_000, interval: 500 },
    )
    .toBeTruthy();
  // The e-mail names the unit's public address; this test's server listens on a port of its own.
  return `${ctx.baseUrl}/set-password#${token}`;
}

async function fillNewPassword(page: Page, password: string) {
  await page.getByLabel('New password', { exact: true }).fill(password);
  await page.getByLabel('New password again').fill(password);
}

describe('an account from first link to being signed out everywhere', () => {
  it('an admin adds a person, who sets a password from the e-mailed link, signs in, changes it, and is signed out everywhere by the admin', async () => {
    const email = `kestrel-${randomUUID().slice(0, 8)}@test.luxtempo.example`;
    const admin = await ctx.browser.newPage({ viewport: { width: 1366, height: 900 } });
    const adminProblems = watchPage(admin, ctx.baseUrl);
    await signInThroughForm(admin, ctx.baseUrl, 'admin@demo.luxtempo.example', demoPassword);
    await admin.getByRole('link', { name: 'People' }).click();
    await admin.getByRole('button', { name: 'Add a person' }).click();
    await admin.getByLabel('Display name').fill('Kestrel Ambleside');
    await admin.getByLabel('E-mail', { exact: true }).fill(email);
    await admin.getByLabel('Nurse').check();
    await admin.getByRole('button', { name: 'Add person' }).click();
    await expect
      .poll(() => admin.getByRole('status').first().innerText())
      .toMatch(/Kestrel Ambleside was added\. A link to set their password was e-mailed/);

    // The person opens the link from the mail catcher, in a browser of their own.
    const link = await linkMailedTo(email);
    const tablet = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
    const person = await tablet.newPage();
    const personProblems = watchPage(person, ctx.baseUrl);
    await person.goto(link);
    await person.getByRole('heading', { name: 'Welcome to Luxtempo' }).waitFor();
    expect(await accessibilityViolations(person)).toEqual([]);
    await fillNewPassword(person, 'short-one');
    await person.getByRole('button', { name: 'Set password' }).click();
    await expect
      .poll(() => person.getByLabel('New password', { exact: true }).getAttribute('aria-invalid'))
      .toBe('true');
    const first = `heron lantern ${randomUUID().slice(0, 6)} quay`;
    await fillNewPassword(person, first);
    await person.getByRole('button', { name: 'Set password' }).click();
    await person.getByText('Your password is set').waitFor();

    // The same link a second time: refused.
    const again = await tablet.newPage();
    await again.goto(link);
    await again.getByText('This link does not work').waitFor();
    await again.close();

    await signInThroughForm(person, ctx.baseUrl, email, first);
    await person.getByRole('navigation', { name: 'Main' }).waitFor();

    // Changes the password from the header.
    await person.getByRole('link', { name: 'Change password' }).click();
    await person.getByRole('heading', { name: 'Change your password' }).waitFor();
    expect(await accessibilityViolations(person)).toEqual([]);
    const second = `marsh fennel ${randomUUID().slice(0, 6)} tide`;
    await person.getByLabel('Current password').fill(first);
    await fillNewPassword(person, second);
    await person.getByRole('button', { name: 'Change password' }).click();
    await person.getByText('Your password was changed').waitFor();

    // Signed in on a second device with the new password.
    const desk = await ctx.browser.newContext();
    const deskPage = await desk.newPage();
    await signInThroughForm(deskPage, ctx.baseUrl, email, second);
    await deskPage.getByRole('navigation', { name: 'Main' }).waitFor();

    // The admin signs the person out everywhere.
    await admin.reload();
    await admin.getByRole('button', { name: 'Sign out everywhere: Kestrel Ambleside' }).click();
    await expect
      .poll(() => admin.getByRole('status').first().innerText())
      .toMatch(/Kestrel Ambleside is signed out everywhere \(2 sessions ended\)/);

    for (const page of [person, deskPage]) {
      await page.reload();
      await page.getByRole('heading', { name: 'Sign in' }).waitFor();
      await expect.poll(() => page.getByText('You were signed out').count()).toBe(1);
    }
    // Their 401s on reload are expected; nothing else went wrong.
    expect(adminProblems).toEqual([]);
    expect(personProblems.filter((p) => !/401/.test(p))).toEqual([]);
    await tablet.close();
    await desk.close();
    await admin.close();
  });
});
