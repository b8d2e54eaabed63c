import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import {
  accessibilityViolations,
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

let ctx: BrowserContext;
beforeAll(async () => {
  ctx = await startBrowserTest();
});
afterAll(async () => {
  await ctx?.close();
});

/** A landscape tablet, the smallest screen the unit uses. */
const tablet = { width: 1024, height: 768 };

async function signedInPage(role: string): Promise<{ page: Page; problems: string[] }> {
  const page = await ctx.browser.newPage({ viewport: tablet });
  const problems = watchPage(page, ctx.baseUrl);
  await signInThroughForm(page, ctx.baseUrl, `${role}@demo.luxtempo.example`, demoPassword);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, problems };
}

/** The number shown in the Value cell of a result row, e.g. "Fluence 49.79 J/cm² Worked out". */
async function resultValue(page: Page, figure: string): Promise<number> {
  const row = page.getByRole('row', { name: new RegExp(`^${figure}\\b`) });
  return Number.parseFloat(await row.getByRole('cell').first().innerText());
}

describe('the protocol pages', () => {
  it('the demo clinician opens Protocols, then pdt-standard version 1, and reads its figures and sources', async () => {
    const { page, problems } = await signedInPage('clinician');

    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Protocols' })
      .click();
    await page.getByRole('heading', { level: 1, name: 'Protocols' }).waitFor();
    const standard = page.getByRole('region', { name: 'Verteporfin PDT — standard' });
    // Version 3 (follow-up fields added) is approved too, so versions 1 and 2 read as superseded by it.
    await expect
      .poll(() => standard.getByRole('row', { name: /v1/ }).innerText())
      .toMatch(/Superseded\s*by v3/);
    expect(await standard.getByRole('row', { name: /^v2/ }).innerText()).toMatch(
      /Superseded\s*by v3/,
    );
    expect(await standard.getByRole('row', { name: /^v3/ }).innerText()).toMatch(/Approved/);
    // A clinician may approve but not import or draft: those controls belong to administrators.
    expect(await page.getByRole('button', { name: /Start a new draft/ }).count()).toBe(0);
    expect(await page.getByLabel('Protocol file (JSON)').count()).toBe(0);
    expect(await accessibilityViolations(page)).toEqual([]);

    await standard
      .getByRole('link', { name: 'Open Verteporfin PDT — standard, version 1' })
      .click();
    await page
      .getByRole('heading', { level: 1, name: /Verteporfin PDT — standard · version 1/ })
      .waitFor();
    const sources = page.getByRole('region', { name: 'Sources' });
    await expect.poll(() => sources.innerText()).toMatch(/TAP/);
    expect(await sources.innerText()).toMatch(/Published/);
    expect(await sources.innerText()).toMatch(/From memory/);
    // TAP Study Group, Arch Ophthalmol 1999: 600 mW/cm² for 83 s, 50 J/cm².
    const light = await page.getByRole('region', { name: 'Light', exact: true }).innerText();
    expect(light).toMatch(/Irradiance \(mW\/cm²\)\s+600/);
    expect(light).toMatch(/Target fluence \(J\/cm²\)\s+50/);
    expect(
      await page.getByRole('region', { name: 'Steps of the step clock' }).getByRole('row').count(),
    ).toBe(1 + 5 + 1);
    expect(await page.getByRole('complementary', { name: 'Caution' }).innerText()).toMatch(
      /approved policy/,
    );
    expect(await accessibilityViolations(page)).toEqual([]);

    expect(problems).toEqual([]);
    await page.close();
  });

  it('an administrator starts a draft from a version, compares it with its source, and sees a refused edit listed by path', async () => {
    const { page, problems } = await signedInPage('admin');
    await page.goto(`${ctx.baseUrl}/protocols`);
    const halfDose = page.getByRole('region', { name: 'Verteporfin PDT — half dose' });
    await halfDose
      .getByRole('button', {
        name: 'Start a new draft from this: Verteporfin PDT — half dose, version 1',
      })
      .click();
    // A draft takes a version number for good: it is made only once confirmed.
    await page.getByRole('dialog').getByRole('button', { name: 'Start the draft' }).click();
    const outcome = page.getByRole('status').filter({ hasText: 'was made from version 1' });
    // The draft takes the next free number after every shipped version of the protocol.
    await expect.poll(() => outcome.innerText()).toMatch(/Draft version \d+ /);
    const draftVersion = Number(/Draft version (\d+) /.exec(await outcome.innerText())![1]);
    expect(draftVersion).toBeGreaterThan(1);
    await outcome.getByRole('link', { name: `Open draft version ${draftVersion}` }).click();
    await page
      .getByRole('heading', { level: 1, name: new RegExp(`version ${draftVersion}`) })
      .waitFor();
    expect(await page.getByText('0 of 2 approvals so far').count()).toBe(1);

    await page.getByLabel('Compare with…').selectOption('1');
    await page.getByRole('button', { name: 'Compare side by side' }).click();
    await page
      .getByRole('heading', {
        level: 1,
        name: new RegExp(`version 1 with version ${draftVersion}`),
      })
      .waitFor();
    const table = page.getByRole('table');
    // A draft copies every figure; only its number differs. Approvals are listed, not diffed.
    await expect
      .poll(() => table.getByRole('row', { name: /^Changed General Version/ }).count())
      .toBe(1);
    expect(await table.getByRole('row').count()).toBe(2);
    expect(await table.getByRole('row', { name: /Irradiance/ }).count()).toBe(0);
    await page.getByLabel('Show the values that are the same too').check();
    await expect
      .poll(() => table.getByRole('row', { name: /^Same Light Irradiance \(mW\/cm²\)/ }).count())
      .toBe(1);
    expect(await accessibilityViolations(page)).toEqual([]);

    await page.getByRole('link', { name: `Back to version ${draftVersion}` }).click();
    await page.getByRole('button', { name: 'Open the editor' }).click();
    const editor = page.getByLabel('Definition (JSON)');
    const definition = JSON.parse(await editor.inputValue()) as { light: { exposureS: number } };
    definition.light.exposureS = -5;
    await editor.fill(JSON.stringify(definition, null, 2));
    await page.getByRole('button', { name: 'Save the draft' }).click();
    const refusal = page.getByRole('alert').filter({ hasText: 'Not saved' });
    await expect.poll(() => refusal.innerText()).toMatch(/light\.exposureS/);
    expect(await refusal.innerText()).toMatch(/greater than 0 s/);
    expect(await accessibilityViolations(page)).toEqual([]);

    // The refused save answered 400, which the browser logs; nothing else may have gone wrong.
    expect(problems.filter((p) => !/status of 400/.test(p))).toEqual([]);
    await page.close();
  });
});

describe('the light calculator', () => {
  it('works out irradiance and fluence from power 42.4 mW, a 3000 µm spot and 83 s', async () => {
    const { page, problems } = await signedInPage('clinician');

    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Light calculator' })
      .click();
    await page.getByRole('heading', { level: 1, name: 'Light calculator' }).waitFor();
    expect(await accessibilityViolations(page)).toEqual([]);

    await page.getByLabel('Power (mW)').fill('42.4');
    await page.getByLabel('Spot diameter (µm)').fill('3000');
    await page.getByLabel('Exposure time (s)').fill('83');
    await page.getByRole('button', { name: 'Calculate' }).click();
    await page.getByRole('heading', { name: 'Result' }).waitFor();

    // Laser arithmetic by definition: area π × 0.3² ÷ 4 = 0.0707 cm²; 42.4 mW ÷ 0.0707 cm² ≈ 600 mW/cm²;
    // 600 mW/cm² × 83 s ≈ 49.8 J/cm² — the standard TAP light dose (TAP Study Group, Arch Ophthalmol 1999).
    expect(Math.abs((await resultValue(page, 'Irradiance')) - 600)).toBeLessThan(1);
    expect(Math.abs((await resultValue(page, 'Fluence')) - 49.8)).toBeLessThan(0.05);
    expect(await page.getByRole('row', { name: /^Fluence/ }).innerText()).toMatch(/Worked out/);
    expect(await page.getByRole('row', { name: /^Power/ }).innerText()).toMatch(/Given by you/);
    expect(await accessibilityViolations(page)).toEqual([]);

    // Changing a figure takes the old answer away, so no result ever sits beside figures it was not made from.
    await page.getByLabel('Exposure time (s)').fill('90');
    await expect.poll(() => page.getByRole('heading', { name: 'Result' }).count()).toBe(0);

    expect(problems).toEqual([]);
    await page.close();
  });

  it('refuses a power of 0 beside the field, naming the allowed range', async () => {
    const { page, problems } = await signedInPage('nurse');
    await page.goto(`${ctx.baseUrl}/light-calculator`);
    const power = page.getByLabel('Power (mW)');
    await power.fill('0');
    await page.getByRole('button', { name: 'Calculate' }).click();
    await expect.poll(() => power.getAttribute('aria-invalid')).toBe('true');
    const describedBy = (await power.getAttribute('aria-describedby')) ?? '';
    const errorId = describedBy.split(' ').find((id) => id.endsWith('-error'));
    expect(await page.locator(`[id="${errorId}"]`).innerText()).toMatch(
      /Power must be a number greater than 0 mW/,
    );
    expect(problems).toEqual([]);
    await page.close();
  });
});
