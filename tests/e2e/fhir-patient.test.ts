import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fhirSystems } from '../../shared/fhir/codes';
import type { Page } from 'playwright-core';
import { demoPassword } from '../../server/demo/seed';
import { demoFhirPatients } from '../../server/fhir-fake/demo-patients';
import { startFakeFhirServer, type FakeFhirServer } from '../../server/fhir-fake/fake-server';
import {
  accessibilityViolations,
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

let fake: FakeFhirServer;
let ctx: BrowserContext;
let page: Page;
// A hospital patient new to this run's database (the browser database keeps earlier runs' rows).
const recordNumber = `MP-9${randomInt(10_000, 99_999)}`;
const familyName = `Dunnock${'abcdefghij'[randomInt(10)]}${'klmnopqrst'[randomInt(10)]}`;

beforeAll(async () => {
  fake = await startFakeFhirServer({
    patients: [
      ...demoFhirPatients(),
      {
        resourceType: 'Patient',
        id: `t-${recordNumber.toLowerCase()}`,
        identifier: [{ system: fhirSystems.recordNumber, value: recordNumber }],
        name: [{ family: familyName, given: ['Perpetua'] }],
        birthDate: '1995-02-17',
      },
    ],
  });
  ctx = await startBrowserTest({ FHIR_BASE_URL: fake.url });
  page = await ctx.browser.newPage({ viewport: { width: 1366, height: 900 } });
  watchPage(page, ctx.baseUrl);
  await signInThroughForm(page, ctx.baseUrl, 'clinician@demo.luxtempo.example', demoPassword);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}, 60_000);

afterAll(async () => {
  await ctx?.close();
  await fake?.stop();
});

describe('a patient taken from the hospital FHIR record', () => {
  it('is found by record number, fills the form, and shows its source once added', async () => {
    await page.goto(`${ctx.baseUrl}/patients`);
    await page.getByRole('button', { name: 'Add a patient' }).click();
    const search = page.getByRole('region', { name: 'Find in the hospital record' });

    // A FHIR server answering nonsense: a clear message, and the form below still there.
    fake.setMode('nonsense');
    await search.getByLabel('Record number or name').fill(recordNumber);
    await search.getByRole('button', { name: 'Search the hospital record' }).click();
    await expect
      .poll(() => search.getByRole('alert').innerText())
      .toMatch(/answer Luxtempo cannot use.*not a FHIR Bundle/s);
    expect(await page.getByLabel('Given name').isEditable()).toBe(true);
    fake.setMode('normal');

    await search.getByRole('button', { name: 'Search the hospital record' }).click();
    await search
      .getByRole('button', {
        name: `Fill the form with Perpetua ${familyName}, record ${recordNumber}`,
      })
      .click();
    expect(await page.getByLabel('Record number', { exact: true }).inputValue()).toBe(recordNumber);
    expect(await page.getByLabel('Given name').inputValue()).toBe('Perpetua');
    expect(await page.getByLabel('Family name').inputValue()).toBe(familyName);
    expect(await page.getByLabel('Date of birth').inputValue()).toBe('17/02/1995');
    expect(await accessibilityViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'Add patient', exact: true }).click();
    await expect
      .poll(() =>
        page
          .getByText(`Source: hospital record, FHIR Patient/t-${recordNumber.toLowerCase()}`, {
            exact: false,
          })
          .count(),
      )
      .toBe(1);
    await page.getByRole('button', { name: 'Read again from the hospital record' }).click();
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'nothing changed' }).count())
      .toBe(1);
  });
});
