import type { APIRequestContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { accessibilityViolations, startBrowserTest, type BrowserContext } from '../support/browser';
import { clockKit, clockOrders } from '../support/clock-kit';
import { deviceBody } from '../support/devices';

/*
 * The device's output check on the step clock's pre-checks, on a 1024×768 tablet: a failing
 * check blocks the start (and the server stores no start); a passing check lets the nurse start
 * the session, which then names the device and the irradiance set.
 */

let ctx: BrowserContext;
let clinician: APIRequestContext;
let pharmacist: APIRequestContext;
let nurseApi: APIRequestContext;
let admin: APIRequestContext;

const { serverNowMs, signedInApi, nursePage, sessionOf } = clockKit(() => ({
  ctx,
  nurseApi,
  reader: clinician,
}));
const { newPatient } = clockOrders(() => ({ clinician, pharmacist }), serverNowMs);

beforeAll(async () => {
  ctx = await startBrowserTest();
  clinician = await signedInApi('clinician@demo.luxtempo.example');
  pharmacist = await signedInApi('pharmacist@demo.luxtempo.example');
  nurseApi = await signedInApi('nurse@demo.luxtempo.example');
  admin = await signedInApi('admin@demo.luxtempo.example');
});
afterAll(async () => {
  await Promise.all([
    clinician?.dispose(),
    pharmacist?.dispose(),
    nurseApi?.dispose(),
    admin?.dispose(),
  ]);
  await ctx?.close();
});

/** A signed CXL order on version 3, whose protocol states the device checks. */
async function readyCxlV3Order() {
  const patient = await newPatient();
  const draft = await clinician.post('/api/orders', {
    data: {
      patientId: patient.id,
      eye: 'left',
      protocol: { key: 'cxl-standard', version: 3 },
      inputs: { stromalThicknessUm: 460 },
      checklist: ['thin-stroma', 'active-infection', 'herpetic-keratitis'].map((q) => ({
        id: q,
        answer: 'no',
      })),
    },
  });
  expect(draft.status(), await draft.text()).toBe(201);
  const { id, version } = (await draft.json()).order as { id: number; version: number };
  const signed = await clinician.post(`/api/orders/${id}/signature`, {
    data: { password: 'luxtempo-demo', meaning: 'ordered', version },
  });
  expect(signed.status()).toBe(200);
  return id;
}

async function recordCheck(page: Page, setMwPerCm2: string, readMwPerCm2: string) {
  await page.getByLabel('Value set (mW/cm²)').fill(setMwPerCm2);
  await page.getByLabel('Meter reading (mW/cm²)').fill(readMwPerCm2);
  await page.getByLabel('Meter identity').fill('UV meter UVM-9 (test)');
  await page.getByLabel('Meter calibration due (YYYY-MM-DD)').fill('2099-01-31');
  await page.getByRole('button', { name: 'Record output check' }).click();
}

describe('the output check before a session, on a tablet', () => {
  it('a failing check blocks the start; after a passing one the nurse starts the session', async () => {
    const device = (await (await admin.post('/api/devices', { data: deviceBody('uv') })).json())
      .device as { id: number; name: string };
    const orderId = await readyCxlV3Order();
    const { page, problems } = await nursePage(orderId);

    await page
      .getByLabel('UV source used')
      .selectOption({ label: `${device.name} — cannot start yet` });
    // 2.5 read against 3 mW/cm² set: 16.7 % under, outside ±10 % (common practice).
    await recordCheck(page, '3', '2.5');
    await page.getByText(/^Failed: 2\.5 mW\/cm² read against 3 mW\/cm² set/).waitFor();
    await page.getByLabel('Irradiance set on the UV source (mW/cm²)').fill('3');
    for (const label of [
      'Patient identity confirmed',
      'Treatment eye confirmed: left eye',
      'Consent confirmed',
      'Protective eyewear on everyone in the room',
      'Device settings match the plan',
    ])
      await page.getByLabel(label).check();
    await page.getByRole('button', { name: 'Start session' }).click();
    await page.getByRole('alert').filter({ hasText: 'no passing output check today' }).waitFor();
    expect((await sessionOf<{ events: unknown[] }>(orderId)).events).toEqual([]);

    // 3.05 read against 3: 1.7 % over, inside ±10 % (common practice).
    await recordCheck(page, '3', '3.05');
    await page.getByText(/^Passed: 3\.05 mW\/cm² read against 3 mW\/cm² set/).waitFor();
    expect(await accessibilityViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Start session' }).click();
    await expect
      .poll(async () => (await sessionOf<{ status: string }>(orderId)).status)
      .toBe('in-session');
    // The clock reads back the start with the server's device record and goes on.
    await page.getByRole('button', { name: 'Start preparation' }).waitFor();
    await page.reload();
    await page.getByRole('button', { name: 'Start preparation' }).waitFor();
    const session = await sessionOf<{
      events: { type: string; device?: object }[];
      record: { deviceUsed: { device: { name: string }; irradianceSetMwPerCm2: number } };
    }>(orderId);
    expect(session.events.find((e) => e.type === 'session-started')?.device).toEqual({
      deviceId: device.id,
      irradianceSetMwPerCm2: 3,
    });
    expect(session.record.deviceUsed).toMatchObject({
      device: { name: device.name },
      irradianceSetMwPerCm2: 3,
    });
    expect(problems).toEqual([]);
  });
});
