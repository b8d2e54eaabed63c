import { randomUUID } from 'node:crypto';
import { DateTime } from 'luxon';
import { request, type APIRequestContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import {
  accessibilityViolations,
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';
import { supersededVersionReason } from '../support/api';

let ctx: BrowserContext;
let clinician: APIRequestContext;

beforeAll(async () => {
  ctx = await startBrowserTest();
  // The demo clinician orders through the API, as the order screens would.
  clinician = await request.newContext({
    baseURL: ctx.baseUrl,
    extraHTTPHeaders: { Origin: ctx.baseUrl },
  });
  const login = await clinician.post('/api/auth/login', {
    data: { email: 'clinician@demo.luxtempo.example', password: demoPassword },
  });
  expect(login.status()).toBe(200);
});
afterAll(async () => {
  await clinician?.dispose();
  await ctx?.close();
});

const pdtChecklist = [
  'porphyria',
  'hypersensitivity',
  'hepatic-impairment',
  'pregnancy-breastfeeding',
  'other-photosensitisers',
];

/** A fictitious patient of this test's own and a signed standard-PDT order for 170 cm / 70 kg. */
async function signedPdtOrder() {
  const suffix = randomUUID().slice(0, 6).toUpperCase();
  const patientRes = await clinician.post('/api/patients', {
    data: {
      recordNumber: `E2E-${suffix}`,
      givenName: 'Odile',
      familyName: `Quarrendon ${suffix}`,
      dateOfBirth: '1958-03-14',
      emailConsent: false,
    },
  });
  expect(patientRes.status()).toBe(201);
  const patient = (await patientRes.json()).patient as {
    id: number;
    recordNumber: string;
    familyName: string;
  };
  const draft = await clinician.post('/api/orders', {
    data: {
      patientId: patient.id,
      eye: 'left',
      protocol: { key: 'pdt-standard', version: 1 },
      // Version 1 is superseded by version 2; the figures here are version 1's.
      supersededVersionReason,
      inputs: {
        height: { value: 170, unit: 'cm' },
        weight: { value: 70, unit: 'kg' },
        bsaFormula: 'mosteller',
        lesionGldUm: 2500,
        lensMagnification: 1,
      },
      checklist: pdtChecklist.map((id) => ({ id, answer: 'no' })),
    },
  });
  expect(draft.status()).toBe(201);
  const { id: orderId, version } = (await draft.json()).order as { id: number; version: number };
  const signed = await clinician.post(`/api/orders/${orderId}/signature`, {
    data: { password: demoPassword, meaning: 'ordered', version },
  });
  expect(signed.status()).toBe(200);
  return { orderId, patient };
}

async function signedInPage(email: string): Promise<{ page: Page; problems: string[] }> {
  const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
  const page = await context.newPage();
  const problems = watchPage(page, ctx.baseUrl);
  await signInThroughForm(page, ctx.baseUrl, email, demoPassword);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, problems };
}

// Standard regimen, 170 cm / 70 kg: Mosteller BSA √(170 × 70 ÷ 3600) = 1.8181 → 1.82 m² (Mosteller RD, N Engl J Med 1987);
// verteporfin 6 mg/m² (TAP Study Group, Arch Ophthalmol 1999) → 10.92 mg; at 2 mg/mL after reconstitution
// (review table, Drug Discov Today 2008) → 5.46 mL, which the plan rounds to 5.5 mL.
const right = { bsa: '1.82', dose: '10.92', volume: '5.46' };

describe('the pharmacist checks a PDT dose blind, prepares it, and the nurse sees it ready', () => {
  it('hides the plan until the figures agree, names the figure that differs, then records preparation with a countdown', async () => {
    const { orderId, patient } = await signedPdtOrder();
    const { page, problems } = await signedInPage('pharmacist@demo.luxtempo.example');

    await page.getByRole('link', { name: 'Dose checks', exact: true }).click();
    await page.getByRole('heading', { level: 1, name: 'Dose checks' }).waitFor();
    await page.getByRole('link', { name: new RegExp(patient.familyName) }).click();
    await page.waitForURL(new RegExp(`/dose-checks/${orderId}$`));
    await page.getByRole('heading', { name: 'Your figures', exact: true }).waitFor();
    await page.getByRole('heading', { name: 'The protocol’s drug figures', exact: true }).waitFor();

    // The measurements and the protocol are there; none of the plan's figures are.
    const blindText = await page.locator('main').innerText();
    expect(blindText).toContain('170 cm');
    expect(blindText).toContain('70 kg');
    expect(blindText).toContain('6 mg/m²');
    for (const planFigure of ['1.82', '10.92', '5.5 mL', '24.5'])
      expect(blindText).not.toContain(planFigure);
    expect(await accessibilityViolations(page)).toEqual([]);

    // A wrong dose: only the dose is marked, and every typed figure stays.
    const bsa = page.getByLabel('BSA (m²)');
    const dose = page.getByLabel('Dose (mg)');
    const volume = page.getByLabel('Drug volume (mL)');
    await bsa.fill(right.bsa);
    await dose.fill('12.5');
    await volume.fill(right.volume);
    await page.getByRole('button', { name: 'Compare with the plan' }).click();
    await expect.poll(() => dose.getAttribute('aria-invalid')).toBe('true');
    expect(await bsa.getAttribute('aria-invalid')).toBeNull();
    expect(await volume.getAttribute('aria-invalid')).toBeNull();
    const doseError = (await dose.getAttribute('aria-describedby'))!.split(' ').at(-1)!;
    expect(await page.locator(`[id="${doseError}"]`).innerText()).toMatch(
      /Differs from the plan by more than ±2 %/,
    );
    expect(await dose.inputValue()).toBe('12.5');
    expect(await bsa.inputValue()).toBe(right.bsa);
    expect(await page.locator('main').innerText()).not.toContain('10.92');
    await page.getByText('This is the last try before the order goes back').waitFor();

    // The right figures: the plan appears beside them.
    await dose.fill(right.dose);
    await page.getByRole('button', { name: 'Compare with the plan' }).click();
    await page.getByRole('heading', { name: 'Dose check: figures agree', exact: true }).waitFor();
    const comparison = page.getByRole('table');
    await expect.poll(() => comparison.innerText()).toContain('10.92 mg');
    const tableText = await comparison.innerText();
    expect(tableText).toContain('1.82 m²');
    expect(tableText).toContain('5.46 mL');
    expect(tableText).toContain('5.5 mL');
    expect(tableText).toContain('24.5 mL');

    // Preparation: reconstitution time defaults to now on the unit's clock.
    await page.getByRole('heading', { name: 'Record the preparation', exact: true }).waitFor();
    expect(await page.getByLabel('Reconstituted at').inputValue()).toMatch(
      /^\d{4}-\d\d-\d\dT\d\d:\d\d$/,
    );
    await page.getByLabel('Vial lot').fill('E2E-LOT 7');
    await page.getByLabel('Vial expiry').fill(DateTime.now().plus({ months: 6 }).toISODate()!);
    await page.getByLabel('Volume drawn (mL)').fill('5.5');
    await page.getByRole('button', { name: 'Record preparation' }).click();
    await page.getByRole('heading', { name: 'Prepared', exact: true }).waitFor();
    // Beyond-use 4 h after reconstitution (review table, Drug Discov Today 2008): about 04:00:00 left.
    const countdown = await page.locator('main').innerText();
    expect(countdown).toMatch(/0[34]:[0-5]\d:[0-5]\d/);
    expect(countdown).toContain('Usable');
    expect(await accessibilityViolations(page)).toEqual([]);

    // Chromium logs every refused fetch as a console error; the one refused check (422) is expected, nothing else.
    expect(problems.filter((problem) => !problem.includes('status of 422'))).toEqual([]);
    expect(problems.filter((problem) => problem.includes('status of 422'))).toHaveLength(1);
    await page.context().close();

    // The nurse finds the order ready on Today.
    const nurse = await signedInPage('nurse@demo.luxtempo.example');
    const ready = nurse.page.getByRole('region', { name: /Ready for treatment/ });
    await ready.getByRole('link', { name: new RegExp(`^${patient.familyName}`) }).waitFor();
    const row = await ready
      .getByRole('listitem')
      .filter({ hasText: patient.familyName })
      .innerText();
    expect(row).toContain(patient.recordNumber);
    expect(row).toContain('Left eye');
    expect(row).toContain('Prepared');
    expect(row).toMatch(/Usable\s*·\s*0[34]:[0-5]\d:[0-5]\d left/);
    expect(await accessibilityViolations(nurse.page)).toEqual([]);
    expect(nurse.problems).toEqual([]);
    await nurse.page.context().close();
  });
});
