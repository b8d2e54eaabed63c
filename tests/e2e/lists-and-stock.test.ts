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

let ctx: BrowserContext;
let clinicianApi: APIRequestContext;

beforeAll(async () => {
  ctx = await startBrowserTest();
  clinicianApi = await request.newContext({
    baseURL: ctx.baseUrl,
    extraHTTPHeaders: { Origin: ctx.baseUrl },
  });
  const login = await clinicianApi.post('/api/auth/login', {
    data: { email: 'clinician@demo.luxtempo.example', password: demoPassword },
  });
  expect(login.status()).toBe(200);
});
afterAll(async () => {
  await clinicianApi?.dispose();
  await ctx?.close();
});

const suffix = randomUUID().slice(0, 6).toUpperCase();
const room = `Laser room ${suffix}`;
const lot = `E2E-${suffix}`;
const today = DateTime.now().setZone('Europe/Lisbon').toISODate()!;

async function signedInPage(email: string, size = { width: 1366, height: 900 }) {
  const context = await ctx.browser.newContext({ viewport: size });
  const page = await context.newPage();
  // A missing element fails here with the locator named, well inside the test's own timeout.
  page.setDefaultTimeout(15_000);
  const problems = watchPage(page, ctx.baseUrl);
  await signInThroughForm(page, ctx.baseUrl, email, demoPassword);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, problems };
}

/** A signed half-dose PDT order for a patient of this test's own (the clinician's order screens are tested elsewhere). */
async function signedOrder() {
  const patientRes = await clinicianApi.post('/api/patients', {
    data: {
      recordNumber: `E2E-L-${suffix}`,
      givenName: 'Peregrine',
      familyName: `Ashcombe ${suffix}`,
      dateOfBirth: '1961-07-09',
      emailConsent: false,
    },
  });
  expect(patientRes.status()).toBe(201);
  const patient = (await patientRes.json()).patient as { id: number; familyName: string };
  const draft = await clinicianApi.post('/api/orders', {
    data: {
      patientId: patient.id,
      eye: 'right',
      protocol: { key: 'pdt-half-dose', version: 3 },
      inputs: {
        height: { value: 168, unit: 'cm' },
        weight: { value: 66, unit: 'kg' },
        bsaFormula: 'mosteller',
        lesionGldUm: 2100,
        lensMagnification: 1,
      },
      checklist: [
        'porphyria',
        'hypersensitivity',
        'hepatic-impairment',
        'pregnancy-breastfeeding',
        'other-photosensitisers',
      ].map((id) => ({ id, answer: 'no' })),
    },
  });
  expect(draft.status()).toBe(201);
  const { id, version } = (await draft.json()).order as { id: number; version: number };
  const signed = await clinicianApi.post(`/api/orders/${id}/signature`, {
    data: { password: demoPassword, meaning: 'ordered', version },
  });
  expect(signed.status()).toBe(200);
  return { orderId: id, patient };
}

async function noAxeViolations(page: Page) {
  expect(await accessibilityViolations(page)).toEqual([]);
}

describe('lists and stock on screen', () => {
  it('the pharmacist receives stock, the clinician books an order into a list, the nurse opens her room’s list', async () => {
    // The pharmacist receives a lot of verteporfin.
    const pharmacy = await signedInPage('pharmacist@demo.luxtempo.example');
    await pharmacy.page.getByRole('link', { name: 'Stock', exact: true }).click();
    await pharmacy.page.getByRole('heading', { level: 1, name: 'Stock' }).waitFor();
    await pharmacy.page.getByLabel('Lot', { exact: true }).fill(lot);
    await pharmacy.page.getByLabel('Expiry').fill(DateTime.now().plus({ months: 6 }).toISODate()!);
    await pharmacy.page.getByLabel('Quantity').fill('5');
    await pharmacy.page.getByRole('button', { name: 'Receive', exact: true }).click();
    await pharmacy.page.getByText(`Received: lot ${lot}, now 5 on hand.`).waitFor();
    const row = pharmacy.page.getByRole('row', { name: new RegExp(lot) });
    await expect.poll(() => row.innerText()).toContain('5 vials');
    await noAxeViolations(pharmacy.page);
    expect(pharmacy.problems).toEqual([]);
    await pharmacy.page.context().close();

    // The clinician makes today's list for a room and books a signed order into its first slot by picking it.
    const { patient } = await signedOrder();
    const clinician = await signedInPage('clinician@demo.luxtempo.example', {
      width: 1024,
      height: 768,
    });
    const page = clinician.page;
    await page.getByRole('link', { name: 'Lists', exact: true }).click();
    await page.getByRole('heading', { level: 1, name: 'Treatment lists' }).waitFor();
    await page.getByRole('button', { name: 'New list' }).click();
    await page.getByLabel('Date', { exact: true }).fill(today);
    await page.getByLabel('Room', { exact: true }).fill(room);
    await page.getByLabel('First slot at').fill('07:00');
    await page.getByLabel('Session length (min)').fill('600');
    await page.getByLabel('Slot length (min)').fill('60');
    await page.getByRole('button', { name: 'Save list' }).click();
    const list = page.getByRole('region', { name: new RegExp(room) });
    await list.waitFor();
    const choice = list.getByLabel(/Order to book at 07:00/);
    const option = choice.locator('option').filter({ hasText: patient.familyName });
    await choice.selectOption(await option.getAttribute('value'));
    // The Book button is reached and pressed with the keyboard.
    await choice.focus();
    await page.keyboard.press('Tab');
    await page.keyboard.press('Enter');
    await list.getByRole('button', { name: /Take off the list at 07:00/ }).waitFor();
    expect(await list.getByRole('row', { name: /07:00/ }).innerText()).toContain(
      `Ashcombe ${suffix}, Peregrine`,
    );
    await noAxeViolations(page);
    expect(clinician.problems).toEqual([]);
    await page.context().close();

    // The nurse opens Today and finds the room's list with the order and its readiness.
    const nurse = await signedInPage('nurse@demo.luxtempo.example', { width: 1024, height: 768 });
    const lists = nurse.page.getByRole('region', { name: 'Today’s treatment lists' });
    await lists.waitFor();
    const roomPick = nurse.page.getByLabel('Your room');
    if (await roomPick.count()) await roomPick.selectOption({ label: room });
    const entry = lists.getByRole('listitem').filter({ hasText: patient.familyName });
    await entry.waitFor();
    const text = await entry.innerText();
    expect(text).toContain('07:00');
    expect(text).toContain('right eye');
    expect(text).toContain('Signed');
    await noAxeViolations(nurse.page);
    expect(nurse.problems).toEqual([]);
    await nurse.page.context().close();
  });
});
