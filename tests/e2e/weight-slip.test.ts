import { randomUUID } from 'node:crypto';
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

const checklistIds = [
  'porphyria',
  'hypersensitivity',
  'hepatic-impairment',
  'pregnancy-breastfeeding',
  'other-photosensitisers',
];

describe('a weight typed in the wrong unit', () => {
  it('183 cm and 92 with the unit left on lb: the BMI warning and the weight change show in both units before signing, and the signature dialog shows birth date, dose and volume', async () => {
    const page = await ctx.browser.newPage({ viewport: { width: 1366, height: 900 } });
    const problems = watchPage(page, ctx.baseUrl);
    await signInThroughForm(page, ctx.baseUrl, 'clinician@demo.luxtempo.example', demoPassword);
    // The session cookie is set once the signed-in shell shows; the setup requests below need it.
    await page.getByRole('navigation', { name: 'Main' }).waitFor();

    // A fictitious patient of this test whose 183 cm / 92 kg was recorded on a signed order.
    const recordNumber = `WS-${randomUUID().slice(0, 8).toUpperCase()}`;
    const patientId = await page.evaluate(
      async ({ recordNumber, checklistIds, password }) => {
        const post = async (url: string, body: unknown) => {
          const res = await fetch(url, {
            method: 'POST',
            headers: { 'Content-Type': 'application/json' },
            body: JSON.stringify(body),
          });
          if (!res.ok) throw new Error(`${url} answered ${res.status}: ${await res.text()}`);
          return res.json();
        };
        const { patient } = await post('/api/patients', {
          recordNumber,
          givenName: 'Orrin',
          familyName: 'Slipstone',
          dateOfBirth: '1961-07-21',
        });
        const { order } = await post('/api/orders', {
          patientId: patient.id,
          eye: 'left',
          protocol: { key: 'pdt-standard', version: 3 },
          inputs: {
            height: { value: 183, unit: 'cm' },
            weight: { value: 92, unit: 'kg' },
            lesionGldUm: 2500,
            lensMagnification: 1,
          },
          checklist: checklistIds.map((id) => ({ id, answer: 'no' })),
        });
        const signed = await post(`/api/orders/${order.id}/signature`, {
          password,
          meaning: 'ordered',
          version: order.version,
        });
        if (signed.order?.status !== 'signed') throw new Error(JSON.stringify(signed));
        return patient.id as number;
      },
      { recordNumber, checklistIds, password: demoPassword },
    );

    await page.goto(`${ctx.baseUrl}/orders/new`);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('New order');
    await page.getByLabel('Find the patient').fill(recordNumber);
    await page.getByRole('button', { name: new RegExp(`Choose .*${recordNumber}`) }).click();
    await page.getByLabel('Right eye').check();
    await page.getByLabel('Protocol version').selectOption('pdt-standard@3');

    // Beside the inputs: the last recorded measurement, in both units.
    const lastRecorded = page.getByRole('region', { name: 'Last recorded for this patient' });
    await expect.poll(() => lastRecorded.innerText()).toContain('weight 92 kg (202.8 lb)');
    expect(await lastRecorded.innerText()).toContain('height 183 cm (72 in)');

    await page.getByLabel('Height', { exact: true }).fill('183');
    await page.getByLabel('Weight', { exact: true }).fill('92');
    await page.getByLabel('Weight unit').selectOption('lb');
    await page.getByLabel('Lesion greatest linear dimension (GLD)').fill('2800');
    await page.getByLabel('Laser-spot magnification of the contact lens').fill('1');
    const questions = page
      .getByRole('region', { name: 'Contraindication checklist' })
      .getByRole('group');
    await expect.poll(() => questions.count()).toBe(checklistIds.length);
    for (const question of await questions.all()) await question.getByLabel('No').check();

    // 92 lb = 41.7 kg (1 lb = 0.45359237 kg); BMI 41.73 / 1.83² = 12.5 kg/m² (common practice / WHO),
    // below the demo soft limit of 16 (common practice). Mosteller (N Engl J Med 1987) 1.46 m² → 8.76 mg
    // at 6 mg/m² (TAP Study Group, Arch Ophthalmol 1999).
    const preview = page.getByRole('region', { name: 'Live preview of the plan' });
    await expect.poll(() => preview.innerText()).toContain('8.76');
    const previewText = await preview.innerText();
    expect(previewText).toContain('92 lb (41.7 kg)');
    expect(previewText).toMatch(/body-mass index 12\.5 kg\/m²/i);
    expect(previewText).toContain('16 to 45 kg/m²');
    // The readiness list names both reasons, so no refusal waits behind the password.
    expect(previewText).toMatch(
      /Before it can be signed[\s\S]*body-mass index 12\.5 kg\/m²[\s\S]*give a reason/i,
    );
    expect(previewText).toContain(
      'The weight 92 lb (41.7 kg) is 54.6 % less than the 92 kg (202.8 lb) recorded today',
    );
    expect(previewText).not.toMatch(/Nothing missing/);
    expect(await accessibilityViolations(page)).toEqual([]);

    await page
      .getByLabel('Reason for the body-mass index outside the usual range')
      .fill('Very thin; weighed again on the ward scale today.');
    await page
      .getByLabel('Reason for the change in weight since the last one recorded')
      .fill('Weight loss confirmed with the patient and the ward scale.');
    await expect.poll(() => preview.innerText()).toMatch(/Nothing missing/);

    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.waitForURL(/\/orders\/\d+$/);
    const orderId = Number(new URL(page.url()).pathname.split('/').pop());
    await expect
      .poll(() => page.getByRole('heading', { level: 1 }).innerText())
      .toBe(`Order ${orderId}`);
    await expect
      .poll(() => page.getByRole('region', { name: 'Measurements entered' }).innerText())
      .toContain('92 lb (41.7 kg)');

    await page.getByRole('button', { name: 'Sign', exact: true }).click();
    const dialog = page.getByRole('dialog', { name: `Sign order ${orderId}` });
    await expect.poll(() => dialog.innerText()).toContain('21/07/1961');
    const dialogText = await dialog.innerText();
    expect(dialogText).toContain('92 lb (41.7 kg)');
    expect(dialogText).toContain('12.5 kg/m²');
    expect(dialogText).toMatch(/Verteporfin dose\s*8\.76 mg/);
    // 8.76 mg ÷ 2 mg/mL (review table, Drug Discov Today 2008) = 4.38 mL, drawn at the 0.01 mL syringe graduation of versions 2 and 3 (common practice).
    expect(dialogText).toMatch(/Drug volume\s*4\.38 mL/);
    expect(dialogText).not.toContain('The server will refuse the signature');
    expect(await accessibilityViolations(page)).toEqual([]);
    await dialog.getByLabel('Your password').fill(demoPassword);
    await dialog.getByRole('button', { name: 'Sign: I order this treatment' }).click();
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'is signed' }).count())
      .toBe(1);

    const history = await page.evaluate(
      async (id) =>
        (await (await fetch(`/api/patients/${id}/measurements`)).json()) as {
          measurements: { weight: { value: number; unit: string } }[];
        },
      patientId,
    );
    expect(history.measurements[0]?.weight).toEqual({ value: 92, unit: 'lb' });
    expect(problems).toEqual([]);
    await page.close();
  });
});
