import { randomUUID } from 'node:crypto';
import { request, type Page } from 'playwright-core';
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
  // Version 1 is superseded by version 2; the figures checked here are version 1's.
  await page
    .getByLabel('Reason for using the superseded version (required)')
    .fill('Figures of this check were worked out on version 1 of the protocol');
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

async function clinicianPage() {
  const context = await ctx.browser.newContext({ viewport: { width: 1366, height: 900 } });
  const page = await context.newPage();
  const problems = watchPage(page, ctx.baseUrl);
  await signInThroughForm(page, ctx.baseUrl, 'clinician@demo.luxtempo.example', demoPassword);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return { page, problems };
}

const keptDraft = (page: Page) => page.getByRole('status', { name: 'Kept draft' });
const reasonBox = (page: Page) => page.getByLabel('Reason to go on despite the yes (required)');

describe('the order form survives any order of entry', () => {
  it('New order → patient → right eye → PDT → 178 cm, 84 kg, GLD 2400 µm, lens 1.6 → Yes on a checklist question: the reason box, no crash', async () => {
    const { page, problems } = await clinicianPage();
    await openNewOrder(page);
    for (const m of measurements) await fill(page, m);
    const preview = page.getByRole('region', { name: 'Live preview of the plan' });
    // 178 cm, 84 kg: Mosteller √(178 × 84 ÷ 3600) = 2.038 → 2.04 m² (Mosteller RD, N Engl J Med 1987).
    await expect.poll(() => preview.innerText()).toContain('2.04');

    // The "photosensitising drug" question (a caution), as met; then every other one (an absolute
    // one opens no reason box: nothing unlocks it).
    const questions = checklistQuestions(page);
    const photosensitiser = questions.filter({ hasText: /photosensiti/i }).first();
    await photosensitiser.getByLabel('Yes').click();
    await expect.poll(() => reasonBox(page).count()).toBe(1);
    for (const question of await questions.all()) await question.getByLabel('Yes').click();
    await expect.poll(() => reasonBox(page).count()).toBeGreaterThanOrEqual(1);
    await expect.poll(() => preview.innerText()).toContain('2.04');
    expect(await page.locator('body').innerText()).not.toMatch(crashScreen);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('every checklist question answered yes then no, before, between and after the measurements, and a yes standing while they are typed, never breaks the form', async () => {
    const { page, problems } = await clinicianPage();
    for (let position = 0; position <= measurements.length; position += 1) {
      await page.evaluate(() => localStorage.clear());
      await openNewOrder(page);
      const questions = checklistQuestions(page);
      await expect.poll(() => questions.count()).toBeGreaterThan(0);
      const all = await questions.all();
      for (const m of measurements.slice(0, position)) await fill(page, m);
      // Yes then no at this position.
      for (const question of all) {
        await question.getByLabel('Yes').click();
        await question.getByLabel('No').click();
      }
      // A yes left standing (its reason box open and empty) while the other measurements are typed.
      for (const question of all) await question.getByLabel('Yes').click();
      for (const m of measurements.slice(position)) await fill(page, m);
      for (const question of all) await question.getByLabel('No').click();
      // Each question once more in the finished form: a yes then a no.
      for (const question of all) {
        await question.getByLabel('Yes').click();
        await question.getByLabel('No').click();
      }
      const preview = page.getByRole('region', { name: 'Live preview of the plan' });
      await expect
        .poll(() => preview.innerText(), {
          message: `measurements before the checklist: ${position}`,
        })
        .toContain('2.04');
      expect(await reasonBox(page).count()).toBe(0);
      expect(await page.locator('body').innerText()).not.toMatch(crashScreen);
      expect(problems, `measurements before the checklist: ${position}`).toEqual([]);
    }
    await page.context().close();
  });
});

describe('what is typed in a form is kept in the browser until it is saved', () => {
  it('an order typed and then reloaded is offered back with the time it was kept, and Restore fills every field again', async () => {
    const { page, problems } = await clinicianPage();
    await openNewOrder(page);
    for (const m of measurements) await fill(page, m);
    const preview = page.getByRole('region', { name: 'Live preview of the plan' });
    await expect.poll(() => preview.innerText()).toContain('2.04');
    // A caution (an absolute contraindication opens no reason box: nothing unlocks it).
    await checklistQuestions(page)
      .filter({ hasText: 'photosensitising' })
      .getByLabel('Yes')
      .click();
    await reasonBox(page).fill('Stopped the drug a week ago; checked with the patient');
    await page.getByLabel('Weight unit').selectOption('lb');
    await page.getByLabel('Weight unit').selectOption('kg');
    await page.getByLabel('Note for the team (optional)').fill('Kept across a reload');
    await page.waitForTimeout(400); // the draft is written 200 ms after the last key
    await page.reload();

    const offer = keptDraft(page);
    await expect.poll(() => offer.count()).toBe(1);
    expect(await offer.innerText()).toMatch(/A draft from \d{2}:\d{2} WES?T was kept/);
    expect(await accessibilityViolations(page)).toEqual([]);
    expect(await page.getByLabel('Height', { exact: true }).inputValue()).toBe(''); // nothing typed shows until restored
    await offer.getByRole('button', { name: 'Restore' }).click();
    await expect.poll(() => page.getByLabel('Height', { exact: true }).inputValue()).toBe('178');
    expect(await page.getByLabel('Weight', { exact: true }).inputValue()).toBe('84');
    expect(await page.getByLabel('Protocol version').inputValue()).toBe('pdt-standard@1');
    expect(await page.getByLabel('Right eye').isChecked()).toBe(true);
    expect(await page.getByRole('button', { name: 'Choose another patient' }).count()).toBe(1);
    await expect
      .poll(() => page.getByLabel('Lesion greatest linear dimension (GLD)').inputValue())
      .toBe('2400');
    expect(await page.getByLabel('Laser-spot magnification of the contact lens').inputValue()).toBe(
      '1.6',
    );
    expect(
      await checklistQuestions(page)
        .filter({ hasText: 'photosensitising' })
        .getByLabel('Yes')
        .isChecked(),
    ).toBe(true);
    expect(await reasonBox(page).inputValue()).toMatch(/^Stopped the drug/);
    expect(await page.getByLabel('Note for the team (optional)').inputValue()).toBe(
      'Kept across a reload',
    );
    await expect.poll(() => preview.innerText()).toContain('2.04');

    // Saving the order drops the draft: the next new order offers nothing.
    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.waitForURL(/\/orders\/\d+$/);
    await page.goto(`${ctx.baseUrl}/orders/new`);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('New order');
    await page.getByLabel('Find the patient').waitFor();
    expect(await keptDraft(page).count()).toBe(0);
    expect(
      await page.evaluate(() =>
        Object.keys(localStorage).filter((k) => k.startsWith('luxtempo.draft.')),
      ),
    ).toEqual([]);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('a draft is not offered after sign-out, nor once it is older than 12 hours, and Discard drops it', async () => {
    const { page, problems } = await clinicianPage();
    const typeAndLeave = async () => {
      await openNewOrder(page);
      await fill(page, ['Height', '178']);
      await page.waitForTimeout(400);
      await page.reload();
      await expect.poll(() => keptDraft(page).count()).toBe(1);
    };

    // Signing out drops every draft (health data must not stay on a shared tablet).
    await typeAndLeave();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    expect(
      await page.evaluate(() =>
        Object.keys(localStorage).filter((k) => k.startsWith('luxtempo.draft.')),
      ),
    ).toEqual([]);
    await signInThroughForm(page, ctx.baseUrl, 'clinician@demo.luxtempo.example', demoPassword);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto(`${ctx.baseUrl}/orders/new`);
    await page.getByLabel('Find the patient').waitFor();
    expect(await keptDraft(page).count()).toBe(0);

    // Older than its 12-hour lifetime: dropped, not offered.
    await typeAndLeave();
    await page.evaluate(() => {
      for (const key of Object.keys(localStorage).filter((k) => k.startsWith('luxtempo.draft.'))) {
        const kept = JSON.parse(localStorage.getItem(key)!) as { savedAt: string };
        kept.savedAt = new Date(Date.now() - 13 * 3600_000).toISOString();
        localStorage.setItem(key, JSON.stringify(kept));
      }
    });
    await page.reload();
    await page.getByLabel('Find the patient').waitFor();
    expect(await keptDraft(page).count()).toBe(0);
    expect(
      await page.evaluate(() =>
        Object.keys(localStorage).filter((k) => k.startsWith('luxtempo.draft.')),
      ),
    ).toEqual([]);

    // Another person's draft on the same browser is never offered.
    await typeAndLeave();
    await page.evaluate(() => {
      for (const key of Object.keys(localStorage).filter((k) => k.startsWith('luxtempo.draft.'))) {
        const kept = JSON.parse(localStorage.getItem(key)!) as { ownerId: number };
        const other = kept.ownerId + 1000;
        localStorage.removeItem(key);
        localStorage.setItem(
          key.replace(`luxtempo.draft.${kept.ownerId}.`, `luxtempo.draft.${other}.`),
          JSON.stringify({ ...kept, ownerId: other }),
        );
      }
    });
    await page.reload();
    await page.getByLabel('Find the patient').waitFor();
    expect(await keptDraft(page).count()).toBe(0);
    await page.evaluate(() => localStorage.clear());

    // Discard drops it for good.
    await typeAndLeave();
    await keptDraft(page).getByRole('button', { name: 'Discard' }).click();
    expect(await keptDraft(page).count()).toBe(0);
    await page.reload();
    await page.getByLabel('Find the patient').waitFor();
    expect(await keptDraft(page).count()).toBe(0);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('the pharmacist’s blind-check figures survive a reload, for that order only', async () => {
    const api = await request.newContext({
      baseURL: ctx.baseUrl,
      extraHTTPHeaders: { Origin: ctx.baseUrl },
    });
    expect(
      (
        await api.post('/api/auth/login', {
          data: { email: 'clinician@demo.luxtempo.example', password: demoPassword },
        })
      ).status(),
    ).toBe(200);
    const suffix = randomUUID().slice(0, 6).toUpperCase();
    const patient = (
      await (
        await api.post('/api/patients', {
          data: {
            recordNumber: `DRF-${suffix}`,
            givenName: 'Ines',
            familyName: `Pellow ${suffix}`,
            dateOfBirth: '1961-05-02',
            emailConsent: false,
          },
        })
      ).json()
    ).patient as { id: number };
    const created = await api.post('/api/orders', {
      data: {
        patientId: patient.id,
        eye: 'right',
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
        checklist: [
          'porphyria',
          'hypersensitivity',
          'hepatic-impairment',
          'pregnancy-breastfeeding',
          'other-photosensitisers',
        ].map((id) => ({ id, answer: 'no' })),
      },
    });
    expect(created.status()).toBe(201);
    const order = (await created.json()).order as { id: number; version: number };
    expect(
      (
        await api.post(`/api/orders/${order.id}/signature`, {
          data: { password: demoPassword, meaning: 'ordered', version: order.version },
        })
      ).status(),
    ).toBe(200);
    await api.dispose();

    const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
    const page = await context.newPage();
    const problems = watchPage(page, ctx.baseUrl);
    await signInThroughForm(page, ctx.baseUrl, 'pharmacist@demo.luxtempo.example', demoPassword);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto(`${ctx.baseUrl}/dose-checks/${order.id}`);
    await page.getByRole('heading', { name: 'Your figures', exact: true }).waitFor();
    // Figures of the pharmacist's own working (values only need to be kept, not right).
    await page.getByLabel('BSA (m²)').fill('1.82');
    await page.getByLabel('Dose (mg)').fill('10.9');
    await page.getByLabel('Comment (optional)').fill('Worked from the chart');
    await page.waitForTimeout(400);
    await page.reload();
    await page.getByRole('heading', { name: 'Your figures', exact: true }).waitFor();
    const offer = keptDraft(page);
    await expect.poll(() => offer.count()).toBe(1);
    expect(await page.getByLabel('BSA (m²)').inputValue()).toBe('');
    await offer.getByRole('button', { name: 'Restore' }).click();
    expect(await page.getByLabel('BSA (m²)').inputValue()).toBe('1.82');
    expect(await page.getByLabel('Dose (mg)').inputValue()).toBe('10.9');
    expect(await page.getByLabel('Comment (optional)').inputValue()).toBe('Worked from the chart');
    // The figures are filed under this order: no other order's check offers them.
    const keys = await page.evaluate(() =>
      Object.keys(localStorage).filter((k) => k.startsWith('luxtempo.draft.')),
    );
    expect(keys).toEqual([expect.stringMatching(new RegExp(`\\.dose-check\\.${order.id}$`))]);
    expect(problems).toEqual([]);
    await context.close();
  });
});

describe('an order changed by someone else while it is open', () => {
  it('saving the older form is refused with a message to reload, even after the screen refreshed in the background, and the colleague’s change stands', async () => {
    const api = await request.newContext({
      baseURL: ctx.baseUrl,
      extraHTTPHeaders: { Origin: ctx.baseUrl },
    });
    expect(
      (
        await api.post('/api/auth/login', {
          data: { email: 'clinician@demo.luxtempo.example', password: demoPassword },
        })
      ).status(),
    ).toBe(200);
    const suffix = randomUUID().slice(0, 6).toUpperCase();
    const patient = (
      await (
        await api.post('/api/patients', {
          data: {
            recordNumber: `STL-${suffix}`,
            givenName: 'Tamsin',
            familyName: `Rosewarne ${suffix}`,
            dateOfBirth: '1966-08-19',
            emailConsent: false,
          },
        })
      ).json()
    ).patient as { id: number };
    const body = {
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
      checklist: [],
    };
    const order = (await (await api.post('/api/orders', { data: body })).json()).order as {
      id: number;
      version: number;
    };

    const { page, problems } = await clinicianPage();
    await page.clock.install();
    await page.goto(`${ctx.baseUrl}/orders/${order.id}/edit`);
    await expect
      .poll(() => page.getByLabel('Lesion greatest linear dimension (GLD)').inputValue())
      .toBe('2500');
    await page.getByLabel('Note for the team (optional)').fill('My note on the older copy');

    // A colleague saves a change meanwhile; this screen then refreshes its data in the background.
    const colleague = await api.put(`/api/orders/${order.id}`, {
      data: { ...body, inputs: { ...body.inputs, lesionGldUm: 3000 }, version: order.version },
    });
    expect(colleague.status()).toBe(200);
    await page.clock.fastForward(31_000); // past the data's 30 s freshness
    const refetched = page.waitForResponse(
      (r) => r.url().endsWith(`/api/orders/${order.id}`) && r.request().method() === 'GET',
    );
    await page.evaluate(() => window.dispatchEvent(new Event('visibilitychange')));
    expect((await (await refetched).json()).order.version).toBe(order.version + 1);

    await page.getByRole('button', { name: 'Save draft' }).click();
    const alert = page.getByRole('alert').filter({ hasText: 'The draft was not saved' });
    await expect
      .poll(() => alert.innerText())
      .toMatch(/changed after you opened it.*reload the order/i);
    const stored = (await (await api.get(`/api/orders/${order.id}`)).json()).order as {
      inputs: { lesionGldUm: number };
      note: string | null;
    };
    expect(stored.inputs.lesionGldUm).toBe(3000);
    expect(stored.note).toBeNull();
    // What was typed is still kept as a draft for after the reload.
    expect(
      await page.evaluate(
        (id) => Object.keys(localStorage).some((k) => k.endsWith(`.order.edit.${id}`)),
        order.id,
      ),
    ).toBe(true);
    await api.dispose();
    // The refusal is a 409 the screen shows; the browser logs that failed request, nothing else.
    expect(problems.filter((p) => !/409/.test(p))).toEqual([]);
    await page.context().close();
  });
});
