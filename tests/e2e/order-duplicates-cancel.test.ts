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

async function clinicianPage(size = { width: 1366, height: 900 }) {
  const context = await ctx.browser.newContext({ viewport: size });
  const page = await context.newPage();
  const problems = watchPage(page, ctx.baseUrl);
  await signInThroughForm(page, ctx.baseUrl, 'clinician@demo.luxtempo.example', demoPassword);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, problems };
}

/** A fictitious patient of the test's own. */
async function newPatient(page: Page, familyName: string) {
  const suffix = randomUUID().slice(0, 6).toUpperCase();
  const res = await page.request.post(`${ctx.baseUrl}/api/patients`, {
    data: {
      recordNumber: `E2E-D${suffix}`,
      givenName: 'Oriel',
      familyName: `${familyName} ${suffix}`,
      dateOfBirth: '1947-11-03',
      emailConsent: false,
    },
  });
  expect(res.status()).toBe(201);
  return (await res.json()).patient as { id: number; familyName: string; recordNumber: string };
}

// 170 cm, 70 kg, GLD 2000 µm, lens 1: inside the demo protocol's usual ranges (demo figures).
const order = (patientId: number) => ({
  patientId,
  eye: 'right',
  protocol: { key: 'pdt-standard', version: 3 },
  inputs: {
    height: { value: 170, unit: 'cm' },
    weight: { value: 70, unit: 'kg' },
    bsaFormula: 'mosteller',
    lesionGldUm: 2000,
    lensMagnification: 1,
  },
  checklist: [
    'porphyria',
    'hypersensitivity',
    'hepatic-impairment',
    'pregnancy-breastfeeding',
    'other-photosensitisers',
  ].map((id) => ({ id, answer: 'no' })),
});

async function fillPdtForm(page: Page, patientId: number) {
  await page.goto(`${ctx.baseUrl}/orders/new?patientId=${patientId}`);
  await page.getByLabel('Protocol version').selectOption('pdt-standard@3');
  await page.getByLabel('Right eye').check();
  await page.getByLabel('Height', { exact: true }).fill('170');
  await page.getByLabel('Weight', { exact: true }).fill('70');
  await page.getByLabel('Lesion greatest linear dimension (GLD)').fill('2000');
  await page.getByLabel('Laser-spot magnification of the contact lens').fill('1');
  const questions = page
    .getByRole('region', { name: 'Contraindication checklist' })
    .getByRole('group');
  await expect.poll(() => questions.count()).toBe(5);
  for (const question of await questions.all()) await question.getByLabel('No').check();
}

describe('the order form tells the truth before signing', () => {
  it('a second order for a treated eye lists the retreatment and duplicate reasons before saving; once the list is empty, the signature goes through', async () => {
    const { page, problems } = await clinicianPage();
    const patient = await newPatient(page, 'Quillon');
    // The eye's first order, signed today: still open, and inside the retreatment interval.
    const first = await page.request.post(`${ctx.baseUrl}/api/orders`, { data: order(patient.id) });
    expect(first.status()).toBe(201);
    const firstOrder = (await first.json()).order;
    const signed = await page.request.post(`${ctx.baseUrl}/api/orders/${firstOrder.id}/signature`, {
      data: { password: demoPassword, meaning: 'ordered', version: firstOrder.version },
    });
    expect(signed.status()).toBe(200);

    await fillPdtForm(page, patient.id);
    const preview = page.getByRole('region', { name: 'Live preview of the plan' });
    await expect.poll(() => preview.innerText()).toMatch(/Before it can be signed/);
    await expect.poll(() => preview.innerText()).toMatch(/same kind of treatment 0 days ago/);
    await expect.poll(() => preview.innerText()).toContain(`order ${firstOrder.id}`);
    const duplicate = page.getByRole('region', { name: 'Another open order for this eye' });
    await expect.poll(() => duplicate.innerText()).toContain(`Order ${firstOrder.id}`);
    expect(await accessibilityViolations(page)).toEqual([]);

    // Saving without the reason is stopped on the form, beside the box.
    await page.getByRole('button', { name: 'Save draft' }).click();
    const reasonBox = page.getByLabel('Reason for a second open order (required)');
    await expect.poll(() => reasonBox.getAttribute('aria-invalid')).toBe('true');
    expect(page.url()).toMatch(/\/orders\/new/);

    await reasonBox.fill('First order was for the wrong lesion; it will be cancelled today.');
    await page
      .getByLabel('Reason to treat again within the minimum interval')
      .fill('Leak persists on angiography; retina lead agreed an early session.');
    await expect.poll(() => preview.innerText()).toMatch(/Nothing missing/);

    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.waitForURL(/\/orders\/\d+$/);
    const orderId = Number(new URL(page.url()).pathname.split('/').pop());
    await expect
      .poll(() => page.getByRole('region', { name: 'Before it can be signed' }).innerText())
      .toMatch(/Nothing missing/);
    await page.getByRole('button', { name: 'Sign', exact: true }).click();
    const dialog = page.getByRole('dialog', { name: `Sign order ${orderId}` });
    await dialog.getByLabel('Your password').fill(demoPassword);
    await dialog.getByRole('button', { name: 'Sign: I order this treatment' }).click();
    const storedStatus = async () =>
      (
        (await (await page.request.get(`${ctx.baseUrl}/api/orders/${orderId}`)).json()) as {
          order: { status: string };
        }
      ).order.status;
    await expect
      .poll(
        async () => ({
          status: await storedStatus(),
          page: await page.locator('main').innerText(),
        }),
        {
          timeout: 15_000,
        },
      )
      .toMatchObject({ status: 'signed' });
    expect(await page.locator('main').innerText()).toContain(`Order ${orderId} is signed`);
    expect(problems).toEqual([]);
  });

  it('the author cancels a draft with a reason; a too-short reason is refused on the dialog first', async () => {
    const { page, problems } = await clinicianPage({ width: 1024, height: 768 });
    const patient = await newPatient(page, 'Teasdale');
    const created = await page.request.post(`${ctx.baseUrl}/api/orders`, {
      data: order(patient.id),
    });
    const draft = (await created.json()).order;
    await page.goto(`${ctx.baseUrl}/orders/${draft.id}`);
    await page.getByRole('button', { name: 'Cancel order' }).click();
    const dialog = page.getByRole('dialog', { name: `Cancel order ${draft.id}` });
    await dialog.getByLabel('Reason for cancelling (required)').fill('n/a');
    await dialog.getByRole('button', { name: 'Cancel this order' }).click();
    await expect
      .poll(() => dialog.innerText())
      .toMatch(/at least 15 characters and 3 different words/);
    expect(await accessibilityViolations(page)).toEqual([]);
    await dialog
      .getByLabel('Reason for cancelling (required)')
      .fill('Patient chose to wait for the next clinic after counselling.');
    await dialog.getByRole('button', { name: 'Cancel this order' }).click();
    const outcome = page.getByRole('status').filter({ hasText: `Order ${draft.id} is cancelled` });
    await expect.poll(() => outcome.count()).toBe(1);
    await expect.poll(() => page.getByRole('note').innerText()).toMatch(/Reason: Patient chose/);
    expect(await page.getByRole('button', { name: 'Cancel order' }).count()).toBe(0);
    const stored = await page.request.get(`${ctx.baseUrl}/api/orders/${draft.id}`);
    expect((await stored.json()).order.status).toBe('cancelled');
    expect(problems).toEqual([]);
  });
});

describe('an administrator cancels an order without reading it', () => {
  it('lists the open order by identity on a tablet, asks a reason of substance, and the order leaves the list', async () => {
    const { page: clinician } = await clinicianPage();
    const patient = await newPatient(clinician, 'Harrowgate');
    const created = await clinician.request.post(`${ctx.baseUrl}/api/orders`, {
      data: order(patient.id),
    });
    const draft = (await created.json()).order;
    const signed = await clinician.request.post(`${ctx.baseUrl}/api/orders/${draft.id}/signature`, {
      data: { password: demoPassword, meaning: 'ordered', version: draft.version },
    });
    expect(signed.status()).toBe(200);

    const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
    const page = await context.newPage();
    const problems = watchPage(page, ctx.baseUrl);
    await signInThroughForm(page, ctx.baseUrl, 'admin@demo.luxtempo.example', demoPassword);
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Cancel orders' })
      .click();
    const row = page
      .getByRole('list', { name: 'Open orders' })
      .getByRole('listitem')
      .filter({ hasText: `Order ${draft.id} ·` });
    await expect.poll(() => row.count()).toBe(1);
    const text = await row.innerText();
    expect(text).toContain(patient.recordNumber);
    expect(text).toContain('Right eye');
    expect(text).toContain('Photodynamic therapy (PDT)');
    // Signed today, written in the unit's figures (day/month/year), not the browser's words.
    expect(text).toMatch(/Signed by .+, \d{2}\/\d{2}\/\d{4}, \d{2}:\d{2}/);
    // Identity only: no figures of the plan and no way to the order's clinical page.
    expect(text).not.toMatch(/mg|mL|kg|BSA/);
    expect(await row.getByRole('link').count()).toBe(0);
    const cancel = row.getByRole('button', { name: `Cancel order ${draft.id}` });
    const box = await cancel.boundingBox();
    expect(box && box.x + box.width <= 1024 && box.x >= 0).toBe(true);
    expect(await accessibilityViolations(page)).toEqual([]);

    await cancel.click();
    const dialog = page.getByRole('dialog', { name: `Cancel order ${draft.id}` });
    await dialog.getByLabel('Reason for cancelling (required)').fill('admin cancel');
    await dialog.getByRole('button', { name: 'Cancel this order' }).click();
    await expect
      .poll(() => dialog.innerText())
      .toMatch(/at least 15 characters and 3 different words/);
    await dialog
      .getByLabel('Reason for cancelling (required)')
      .fill('Clinic closed by the fire alarm; the consultant asked for a new date.');
    await dialog.getByRole('button', { name: 'Cancel this order' }).click();
    const outcome = page.getByRole('status').filter({ hasText: `Order ${draft.id} is cancelled` });
    await expect.poll(() => outcome.count()).toBe(1);
    await expect.poll(() => row.count()).toBe(0);
    // The server holds the line: the cancelled order is stored, and still not readable to the admin.
    expect((await page.request.get(`${ctx.baseUrl}/api/orders/${draft.id}`)).status()).toBe(403);
    const stored = await clinician.request.get(`${ctx.baseUrl}/api/orders/${draft.id}`);
    expect((await stored.json()).order).toMatchObject({
      status: 'cancelled',
      cancellation: {
        reason: 'Clinic closed by the fire alarm; the consultant asked for a new date.',
      },
    });
    expect(problems).toEqual([]);
    await context.close();
  });
});

describe('a possible duplicate patient', () => {
  it('is shown with a link before saving, and saved only with the confirmation and a reason', async () => {
    const { page, problems } = await clinicianPage();
    const existing = await newPatient(page, 'Marlowe');
    await page.goto(`${ctx.baseUrl}/patients`);
    await page.getByRole('button', { name: 'Add a patient' }).click();
    const form = page.getByRole('region', { name: 'Add a patient' });
    await form.getByLabel('Record number').fill(`E2E-N${randomUUID().slice(0, 6).toUpperCase()}`);
    await form.getByLabel('Given name').fill('oriel');
    await form.getByLabel('Family name').fill(existing.familyName);
    await form.getByLabel('Date of birth').fill('1947-11-03');
    const warning = form.getByRole('alert').filter({ hasText: 'Possible duplicate' });
    await expect.poll(() => warning.count()).toBe(1);
    expect(
      await warning.getByRole('link', { name: new RegExp(existing.recordNumber) }).count(),
    ).toBe(1);

    await form.getByRole('button', { name: 'Add patient' }).click();
    await expect.poll(() => form.innerText()).toMatch(/Confirm that this is another person/);
    await form.getByLabel('This is another person with the same name and date of birth').check();
    await form.getByLabel('How you know it is another person (required)').fill('ok');
    await form.getByRole('button', { name: 'Add patient' }).click();
    await expect.poll(() => form.innerText()).toMatch(/at least 15 characters/);
    expect(await accessibilityViolations(page)).toEqual([]);
    await form
      .getByLabel('How you know it is another person (required)')
      .fill('Different address and GP; checked with the patient at the desk.');
    await form.getByRole('button', { name: 'Add patient' }).click();
    await expect.poll(() => page.url()).toMatch(/\/patients\/\d+/);
    expect(problems).toEqual([]);
  });
});
