import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoScenario } from '../../server/demo/scenario';
import { demoPassword } from '../../server/demo/seed';
import { sourceMarkPattern } from '../../shared/protocol/source-marks';
import {
  accessibilityViolations,
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

/*
 * Protocol drafts and approvals, the compare screen, the superseded-version choice on the order
 * form, and where source marks may appear. Drafts are made of "Verteporfin PDT — half time",
 * which no other browser test orders with: approving one supersedes that protocol's versions.
 */

let ctx: BrowserContext;
beforeAll(async () => {
  ctx = await startBrowserTest();
  await seedDemoScenario(ctx.server.dataSource, 'Europe/Lisbon');
});
afterAll(async () => {
  await ctx?.close();
});

const tablet = { width: 1024, height: 768 };
const protocolTitle = 'Verteporfin PDT — half time';

async function signedInPage(role: string): Promise<{ page: Page; problems: string[] }> {
  const context = await ctx.browser.newContext({ viewport: tablet });
  const page = await context.newPage();
  const problems = watchPage(page, ctx.baseUrl);
  await signInThroughForm(page, ctx.baseUrl, `${role}@demo.luxtempo.example`, demoPassword);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, problems };
}

async function versionCount(page: Page): Promise<number> {
  const region = page.getByRole('region', { name: protocolTitle });
  return region.getByRole('row', { name: /^v\d+/ }).count();
}

/** Makes a draft of the half-time protocol from version 1, through the confirmation; returns its number. */
async function draftFromList(page: Page): Promise<number> {
  await page.goto(`${ctx.baseUrl}/protocols`);
  const region = page.getByRole('region', { name: protocolTitle });
  await region.getByRole('row').first().waitFor();
  await region
    .getByRole('button', { name: `Start a new draft from this: ${protocolTitle}, version 1` })
    .click();
  const dialog = page.getByRole('dialog');
  await dialog.getByRole('button', { name: 'Start the draft' }).click();
  const outcome = page.getByRole('status').filter({ hasText: 'was made from version 1' });
  await expect.poll(() => outcome.innerText()).toMatch(/Draft version \d+ /);
  return Number(/Draft version (\d+) /.exec(await outcome.innerText())![1]);
}

describe('protocol drafts', () => {
  it('the list passes axe for an administrator, and a draft is made only after confirming; it can then be discarded with a reason', async () => {
    const { page, problems } = await signedInPage('admin');
    await page.goto(`${ctx.baseUrl}/protocols`);
    const region = page.getByRole('region', { name: protocolTitle });
    await region.getByRole('row').first().waitFor();
    // The "Start a new draft from this" buttons are named by their visible words first.
    expect(await accessibilityViolations(page)).toEqual([]);
    const before = await versionCount(page);

    await region
      .getByRole('button', { name: `Start a new draft from this: ${protocolTitle}, version 1` })
      .click();
    const dialog = page.getByRole('dialog');
    await expect.poll(() => dialog.innerText()).toMatch(/Start a new draft from/);
    expect(await accessibilityViolations(page)).toEqual([]);
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await expect.poll(() => dialog.count()).toBe(0);
    await page.reload();
    await region.getByRole('row').first().waitFor();
    expect(await versionCount(page)).toBe(before);

    const draft = await draftFromList(page);
    await page.getByRole('link', { name: `Open draft version ${draft}` }).click();
    await page.getByRole('heading', { level: 1, name: new RegExp(`version ${draft}`) }).waitFor();
    expect(await accessibilityViolations(page)).toEqual([]);

    await page.getByRole('button', { name: `Discard draft ${draft}…` }).click();
    const discard = page.getByRole('dialog');
    await discard.getByRole('button', { name: `Discard draft ${draft}` }).click();
    // No reason: nothing happens but a message beside the field.
    await expect
      .poll(() => discard.getByLabel('Reason for discarding').getAttribute('aria-invalid'))
      .toBe('true');
    await discard
      .getByLabel('Reason for discarding')
      .fill('Made by mistake while testing the list');
    await discard.getByRole('button', { name: `Discard draft ${draft}` }).click();
    await expect
      .poll(() =>
        page
          .getByRole('status')
          .filter({ hasText: `Draft ${draft} was discarded` })
          .count(),
      )
      .toBe(1);
    expect(await page.getByText('Discarded', { exact: true }).count()).toBeGreaterThan(0);
    expect(await page.getByRole('button', { name: /Approve version/ }).count()).toBe(0);
    expect(problems).toEqual([]);
    await page.close();
  });

  it('approval is a signature: a wrong password approves nothing; two right ones approve; the compare screen names fields and approvers', async () => {
    const admin = await signedInPage('admin');
    const draft = await draftFromList(admin.page);
    await admin.page.close();

    const clinician = await signedInPage('clinician');
    const page = clinician.page;
    await page.goto(`${ctx.baseUrl}/protocols/pdt-half-time/v/${draft}`);
    await page.getByRole('button', { name: `Approve version ${draft}` }).click();
    const dialog = page.getByRole('dialog');
    await expect
      .poll(() => dialog.innerText())
      .toMatch(/I have checked every figure and source of this version and approve it/);
    expect(await accessibilityViolations(page)).toEqual([]);
    await dialog.getByLabel('Your password').fill('not-the-password');
    await dialog.getByRole('button', { name: `Sign: approve version ${draft}` }).click();
    await dialog.locator('input[type="password"][aria-invalid="true"]').waitFor();
    expect(await dialog.innerText()).toMatch(/password is not right/);
    await dialog.getByRole('button', { name: 'Not now' }).click();
    expect(await page.getByText('0 of 2 approvals so far').count()).toBe(1);

    await page.getByRole('button', { name: `Approve version ${draft}` }).click();
    await dialog.getByLabel('Your password').fill(demoPassword);
    await dialog.getByRole('button', { name: `Sign: approve version ${draft}` }).click();
    await page.getByRole('status').filter({ hasText: '(1 of 2)' }).waitFor();
    // The refused try left its 400 in the console; nothing else may have gone wrong.
    expect(clinician.problems.filter((p) => !/status of 400/.test(p))).toEqual([]);
    await page.close();

    const pharmacist = await signedInPage('pharmacist');
    await pharmacist.page.goto(`${ctx.baseUrl}/protocols/pdt-half-time/v/${draft}`);
    await pharmacist.page.getByRole('button', { name: `Approve version ${draft}` }).click();
    const second = pharmacist.page.getByRole('dialog');
    await second.getByLabel('Your password').fill(demoPassword);
    await second.getByRole('button', { name: `Sign: approve version ${draft}` }).click();
    // A signature checks the password (bcrypt), which takes longer than a poll's second.
    await pharmacist.page.getByRole('status').filter({ hasText: 'is now approved' }).waitFor();
    const approvals = pharmacist.page.getByRole('region', { name: 'Approvals' });
    expect(await approvals.innerText()).toMatch(/Signed with password/);

    // Version 1 is superseded now, and the compare screen speaks the version page's language.
    await pharmacist.page.goto(`${ctx.baseUrl}/protocols/pdt-half-time/compare/1/${draft}`);
    const table = pharmacist.page.getByRole('table');
    await expect.poll(() => table.getByRole('row').count()).toBeGreaterThan(1);
    expect(await table.getByRole('row', { name: /^Changed General Version/ }).count()).toBe(1);
    expect(await table.innerText()).not.toMatch(/approval\.|\w+\.\w+[A-Z]\w*|\[\d+\]/);
    expect(await table.getByRole('row', { name: /Removed/ }).count()).toBe(0);
    await pharmacist.page.getByLabel('Show the values that are the same too').check();
    await expect
      .poll(() => table.getByRole('row', { name: /^Same Light Irradiance \(mW\/cm²\)/ }).count())
      .toBe(1);
    const before = pharmacist.page.getByRole('region', { name: 'Approvals of version 1' });
    const after = pharmacist.page.getByRole('region', { name: `Approvals of version ${draft}` });
    expect(await before.innerText()).toMatch(/recorded in the shipped file/);
    expect(await after.innerText()).toMatch(/Dr Wren Halloway \(demo\)/);
    expect(await after.innerText()).toMatch(/Osric Vantongeren \(demo\)/);
    expect(await accessibilityViolations(pharmacist.page)).toEqual([]);
    expect(pharmacist.problems).toEqual([]);
    await pharmacist.page.close();

    // The order form offers the newest first and asks why for the superseded one.
    const ordering = await signedInPage('clinician');
    await ordering.page.goto(`${ctx.baseUrl}/orders/new`);
    const select = ordering.page.getByLabel('Protocol version');
    await select
      .locator('option', { hasText: `${protocolTitle} — version ${draft}` })
      .waitFor({ state: 'attached' });
    const options = await select.locator('option').allInnerTexts();
    const halfTime = options.filter((o) => o.startsWith(protocolTitle));
    expect(halfTime[0]).toBe(`${protocolTitle} — version ${draft}`);
    expect(halfTime.at(-1)).toMatch(/version 1 \(superseded by version \d+; needs a reason\)/);
    // Choosing the protocol chooses its newest version: the protocol's one entry among the
    // treatments is the new version; every older one waits apart, marked as needing a reason.
    const offered = select.locator('optgroup[label="Photodynamic therapy"] option', {
      hasText: protocolTitle,
    });
    expect(await offered.allInnerTexts()).toEqual([`${protocolTitle} — version ${draft}`]);
    const apart = await select
      .locator('optgroup[label^="Superseded versions"] option', { hasText: protocolTitle })
      .allInnerTexts();
    expect(apart.length).toBeGreaterThan(0);
    for (const text of apart) expect(text).toMatch(/needs a reason/);
    await select.selectOption('pdt-half-time@1');
    const reason = ordering.page.getByLabel('Reason for using the superseded version (required)');
    await reason.waitFor();
    await ordering.page.getByRole('button', { name: `Use version ${draft} instead` }).click();
    expect(await select.inputValue()).toBe(`pdt-half-time@${draft}`);
    expect(await reason.count()).toBe(0);
    expect(await accessibilityViolations(ordering.page)).toEqual([]);
    expect(ordering.problems).toEqual([]);
    await ordering.page.close();
  });
});

describe('source marks', () => {
  it('show on the protocol page, but not on the order form nor on the discharge sheet', async () => {
    const { page, problems } = await signedInPage('clinician');
    await page.goto(`${ctx.baseUrl}/protocols/pdt-standard/v/1`);
    const sources = page.getByRole('region', { name: 'Sources' });
    await expect.poll(() => sources.innerText()).toMatch(sourceMarkPattern);

    await page.goto(`${ctx.baseUrl}/orders/new`);
    await page.getByLabel('Protocol version').selectOption('pdt-standard@1');
    const checklist = page.getByRole('region', { name: 'Contraindication checklist' });
    await expect.poll(() => checklist.getByRole('group').count()).toBeGreaterThan(0);
    expect(await page.locator('main').innerText()).not.toMatch(sourceMarkPattern);
    expect(await page.locator('main').innerText()).not.toMatch(/Source:/);
    // Version 1 is superseded by version 2: the reason box is there, named for what it asks.
    await page.getByLabel('Reason for using the superseded version (required)').waitFor();
    expect(await accessibilityViolations(page)).toEqual([]);
    expect(problems).toEqual([]);
    await page.close();

    const nurse = await signedInPage('nurse');
    await nurse.page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Orders', exact: true })
      .click();
    await nurse.page.getByLabel('Status').selectOption({ label: 'Completed' });
    // Casimir Brightwater's standard PDT in the demo history.
    const row = nurse.page.getByRole('row').filter({ hasText: 'MP-100203' });
    await expect.poll(() => row.count()).toBe(1);
    await row.getByRole('link', { name: /^Order \d+/ }).click();
    await nurse.page.getByRole('link', { name: 'Discharge sheet' }).click();
    await nurse.page
      .getByRole('heading', { level: 1, name: /Going home after your photodynamic therapy/ })
      .waitFor();
    const sheet = await nurse.page.locator('main').innerText();
    expect(sheet).not.toMatch(sourceMarkPattern);
    expect(sheet).not.toMatch(/from memory/i);
    expect(nurse.problems).toEqual([]);
    await nurse.page.close();
  });
});
