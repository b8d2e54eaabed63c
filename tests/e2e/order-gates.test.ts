import { randomUUID } from 'node:crypto';
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

async function headingText(page: Page): Promise<string> {
  return page.getByRole('heading', { level: 1 }).innerText();
}

async function signedInPage(email: string): Promise<{ page: Page; problems: string[] }> {
  const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
  const page = await context.newPage();
  const problems = watchPage(page, ctx.baseUrl);
  await signInThroughForm(page, ctx.baseUrl, email, demoPassword);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, problems };
}

const reason = 'Mild, stable on review; hepatology agrees with treatment.';

describe('gate 1 as the clinician and the pharmacist meet it', () => {
  it('an absolute yes cannot be signed; a caution with a reason signs and its banner follows the order to the dose check', async () => {
    const { page, problems } = await signedInPage('clinician@demo.luxtempo.example');

    // A fictitious patient of this test's own, with no earlier treatment to ask a retreatment reason for.
    const suffix = randomUUID().slice(0, 6).toUpperCase();
    const created = await page.request.post(`${ctx.baseUrl}/api/patients`, {
      data: {
        recordNumber: `E2E-G${suffix}`,
        givenName: 'Perpetua',
        familyName: `Wrenfield ${suffix}`,
        dateOfBirth: '1952-07-09',
        emailConsent: false,
      },
    });
    expect(created.status()).toBe(201);
    const patientId = (await created.json()).patient.id as number;
    await page.goto(`${ctx.baseUrl}/orders/new?patientId=${patientId}`);
    await expect.poll(() => headingText(page)).toBe('New order');

    await page.getByLabel('Protocol version').selectOption('pdt-standard@3');
    await page.getByLabel('Right eye').check();
    await page.getByLabel('Height', { exact: true }).fill('170');
    await page.getByLabel('Weight', { exact: true }).fill('70');
    await page.getByLabel('Lesion greatest linear dimension (GLD)').fill('2000');
    await page.getByLabel('Laser-spot magnification of the contact lens').fill('1');
    const checklist = page.getByRole('region', { name: 'Contraindication checklist' });
    const questions = checklist.getByRole('group');
    await expect.poll(() => questions.count()).toBe(5);
    for (const question of await questions.all()) await question.getByLabel('No').check();

    // Porphyria: absolute for verteporfin (from memory, in the protocol file). The form says so plainly
    // and offers no reason box.
    const porphyria = questions.filter({ hasText: 'Does the patient have porphyria?' });
    await porphyria.getByLabel('Yes').check();
    const block = checklist.getByRole('alert').filter({ hasText: 'This order cannot be signed' });
    await expect.poll(() => block.count()).toBe(1);
    expect(await checklist.getByLabel(/Reason to go on/).count()).toBe(0);
    const preview = page.getByRole('region', { name: 'Live preview of the plan' });
    await expect
      .poll(() => preview.innerText())
      .toMatch(/absolute contraindication.*no reason unlocks it/i);
    // 170 cm, 70 kg: Mosteller 1.82 m² (Mosteller 1987); 6 mg/m² (TAP Study Group 1999) → 10.92 mg; 2 mg/mL
    // (Drug Discov Today 2008) → 5.46 mL on the 0.01 mL graduation (common practice); dose in the drawn volume 10.92 mg.
    expect(await preview.innerText()).toContain('5.46');
    expect(await accessibilityViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.waitForURL(/\/orders\/\d+$/);
    const orderId = Number(new URL(page.url()).pathname.split('/').pop());

    // Trying to sign anyway: the server refuses, naming the checklist question; the order stays a draft.
    await page.getByRole('button', { name: 'Sign', exact: true }).click();
    const dialog = page.getByRole('dialog', { name: `Sign order ${orderId}` });
    await dialog.getByLabel('Your password').fill(demoPassword);
    await dialog.getByRole('button', { name: 'Sign: I order this treatment' }).click();
    await expect
      .poll(() => dialog.getByRole('alert').innerText())
      .toMatch(/Checklist: .*porphyria.*absolute contraindication/is);
    const afterRefusal = await page.evaluate(
      async (id) =>
        (await (await fetch(`/api/orders/${id}`)).json()) as { order: { status: string } },
      orderId,
    );
    expect(afterRefusal.order.status).toBe('draft');
    await dialog.getByRole('button', { name: 'Cancel' }).click();

    // Correct the answer; record a caution with a reason of substance instead.
    await page.getByRole('link', { name: 'Edit' }).click();
    await expect.poll(() => questions.count()).toBe(5);
    await porphyria.getByLabel('No').check();
    const hepatic = questions.filter({ hasText: 'hepatic impairment' });
    await hepatic.getByLabel('Yes').check();
    await checklist.getByLabel(/Reason to go on/).fill('ok');
    await expect.poll(() => preview.innerText()).toMatch(/at least 15 characters/);
    await checklist.getByLabel(/Reason to go on/).fill(reason);
    await expect.poll(() => preview.innerText()).toMatch(/Nothing missing/);
    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.waitForURL(new RegExp(`/orders/${orderId}$`));

    await page.getByRole('button', { name: 'Sign', exact: true }).click();
    await dialog.getByLabel('Your password').fill(demoPassword);
    await dialog.getByRole('button', { name: 'Sign: I order this treatment' }).click();
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'is signed' }).count())
      .toBe(1);

    // The signed order carries the standing banner with the reason.
    const banner = page.getByRole('region', {
      name: /caution was accepted when this order was signed/,
    });
    await expect.poll(() => banner.innerText()).toContain(reason);
    expect(await banner.innerText()).toContain(
      'Does the patient have moderate or severe hepatic impairment? — yes',
    );
    expect(await accessibilityViolations(page)).toEqual([]);
    // The one refused signature above, and nothing else.
    expect(problems).toEqual([
      expect.stringMatching(
        /^console: Failed to load resource: the server responded with a status of 400 \(Bad Request\) \(http:\/\/[^)]+\/api\/orders\/\d+\/signature\)$/,
      ),
    ]);

    // The pharmacist meets the same banner on the blind dose check, before any figure is shown.
    const pharmacist = await signedInPage('pharmacist@demo.luxtempo.example');
    await pharmacist.page.goto(`${ctx.baseUrl}/dose-checks/${orderId}`);
    const pharmacyBanner = pharmacist.page.getByRole('region', {
      name: /caution was accepted when this order was signed/,
    });
    await expect.poll(() => pharmacyBanner.innerText()).toContain(reason);
    expect(await accessibilityViolations(pharmacist.page)).toEqual([]);
    expect(pharmacist.problems).toEqual([]);
  });
});
