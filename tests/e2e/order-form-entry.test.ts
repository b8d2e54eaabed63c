import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import { signInThroughForm, startBrowserTest, watchPage, type BrowserContext } from '../support/browser';

let ctx: BrowserContext;
beforeAll(async () => {
  ctx = await startBrowserTest();
});
afterAll(async () => {
  await ctx?.close();
});

const crashScreen = /could not be shown|stopped unexpectedly/i;

async function openNewOrder(page: Page) {
  await page.goto(`${ctx.baseUrl}/orders/new`);
  await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('New order');
  await page.getByLabel('Find the patient').fill('MP-100203');
  await page.getByRole('button', { name: /Choose .*MP-100203/ }).click();
  await page.getByLabel('Right eye').check();
  await page.getByLabel('Protocol version').selectOption('pdt-standard@1');
}

// The measurements of the slip as met: height 178 cm, weight 84 kg, GLD 2400 µm, lens factor 1.6
// (demo figures inside the demo protocol's usual ranges).
const measurements: [label: string, value: string][] = [
  ['Height', '178'],
  ['Weight', '84'],
  ['Lesion greatest linear dimension (GLD)', '2400'],
  ['Laser-spot magnification of the contact lens', '1.6'],
];

async function fill(page: Page, [label, value]: [string, string]) {
  await page.getByLabel(label, { exact: true }).fill(value);
}

function checklistQuestions(page: Page) {
  return page.getByRole('region', { name: 'Contraindication checklist' }).getByRole('group');
}

describe('the order form survives any order of entry', () => {
  it('a "yes" on the checklist after the measurements shows the reason box, not the crash screen', async () => {
    const page = await ctx.browser.newPage({ viewport: { width: 1366, height: 900 } });
    const problems = watchPage(page, ctx.baseUrl);
    await signInThroughForm(page, ctx.baseUrl, 'clinician@demo.luxtempo.example', demoPassword);
    await openNewOrder(page);
    for (const m of measurements) await fill(page, m);
    const preview = page.getByRole('region', { name: 'Live preview of the plan' });
    // 178 cm, 84 kg: Mosteller √(178 × 84 ÷ 3600) = 2.038 → 2.04 m² (Mosteller RD, N Engl J Med 1987).
    await expect.poll(() => preview.innerText()).toContain('2.04');

    // A caution (an absolute contraindication takes no reason: nothing unlocks it).
    const first = checklistQuestions(page).filter({ hasText: 'photosensitising' });
    await first.getByLabel('Yes').check();
    await expect.poll(() => page.getByLabel('Reason to go on despite the yes (required)').count()).toBe(1);
    expect(await page.locator('body').innerText()).not.toMatch(crashScreen);
    expect(problems).toEqual([]);

    // A reload offers back everything typed, and bringing it back fills the form again.
    await page.getByLabel('Reason to go on despite the yes (required)').fill('Stopped the drug a week ago; checked with the patient');
    await page.waitForTimeout(400); // the draft is written 200 ms after the last key
    await page.reload();
    const offer = page.getByRole('status').filter({ hasText: 'Unsaved order' });
    await expect.poll(() => offer.count()).toBe(1);
    expect(await page.getByLabel('Height', { exact: true }).inputValue()).toBe('');
    await offer.getByRole('button', { name: 'Bring it back' }).click();
    await expect.poll(() => page.getByLabel('Height', { exact: true }).inputValue()).toBe('178');
    expect(await page.getByLabel('Weight', { exact: true }).inputValue()).toBe('84');
    expect(await page.getByLabel('Protocol version').inputValue()).toBe('pdt-standard@1');
    expect(await page.getByLabel('Right eye').isChecked()).toBe(true);
    await expect.poll(() => page.getByLabel('Lesion greatest linear dimension (GLD)').inputValue()).toBe('2400');
    expect(await checklistQuestions(page).filter({ hasText: 'photosensitising' }).getByLabel('Yes').isChecked()).toBe(true);
    expect(await page.getByLabel('Reason to go on despite the yes (required)').inputValue()).toMatch(/^Stopped the drug/);
    await expect.poll(() => preview.innerText()).toContain('2.04');
    expect(problems).toEqual([]);

    // Cancel means "throw it away": the next new order starts empty and offers nothing.
    await page.getByRole('link', { name: 'Cancel' }).click();
    await page.goto(`${ctx.baseUrl}/orders/new`);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('New order');
    expect(await page.getByRole('status').filter({ hasText: 'Unsaved order' }).count()).toBe(0);
    await page.close();
  });

  it('every checklist question answered yes then no, before, between and after the measurements, never breaks the form', async () => {
    const page = await ctx.browser.newPage({ viewport: { width: 1366, height: 900 } });
    const problems = watchPage(page, ctx.baseUrl);
    await signInThroughForm(page, ctx.baseUrl, 'clinician@demo.luxtempo.example', demoPassword);
    for (let position = 0; position <= measurements.length; position += 1) {
      await page.evaluate(() => sessionStorage.clear());
      await openNewOrder(page);
      const questions = checklistQuestions(page);
      await expect.poll(() => questions.count()).toBeGreaterThan(0);
      for (const m of measurements.slice(0, position)) await fill(page, m);
      for (const question of await questions.all()) {
        await question.getByLabel('Yes').check();
        await question.getByLabel('No').check();
      }
      for (const m of measurements.slice(position)) await fill(page, m);
      // Each question once more in the finished form: a yes then a no.
      for (const question of await questions.all()) {
        await question.getByLabel('Yes').check();
        await question.getByLabel('No').check();
      }
      const preview = page.getByRole('region', { name: 'Live preview of the plan' });
      await expect.poll(() => preview.innerText(), { message: `measurements before the checklist: ${position}` }).toContain('2.04');
      expect(await page.locator('body').innerText()).not.toMatch(crashScreen);
      expect(problems, `measurements before the checklist: ${position}`).toEqual([]);
    }
    await page.close();
  });
});
