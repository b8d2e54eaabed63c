import { randomUUID } from 'node:crypto';
import { request, type APIRequestContext, type Page } from 'playwright-core';
import { expect } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import { supersededVersionReason } from './api';
import { deviceBody, testMeter } from './devices';
import { signInThroughForm, watchPage, type BrowserContext } from './browser';

/**
 * What the step-clock browser tests share: the page on Playwright's clock and the server on
 * `serverClock`, moved together; signed-in API clients; tablets signed in through the form; taps
 * placed on the server's timeline. `current` is read at call time (the context is made in beforeAll).
 */
export function clockKit(
  current: () => { ctx: BrowserContext; nurseApi: APIRequestContext; reader: APIRequestContext },
) {
  const serverNowMs = () => Date.now() + current().ctx.serverClock.offsetMs;

  /** Moves the server's clock, then the page's, by the same amount (server first: a request in between then only sees the server ahead). */
  async function advance(page: Page, ms: number) {
    const step = Math.max(0, Math.round(ms));
    current().ctx.serverClock.offsetMs += step;
    await page.clock.fastForward(step);
  }

  /** An API client signed in as a demo person. */
  async function signedInApi(email: string) {
    const { baseUrl } = current().ctx;
    const api = await request.newContext({
      baseURL: baseUrl,
      extraHTTPHeaders: { Origin: baseUrl },
    });
    expect(
      (await api.post('/api/auth/login', { data: { email, password: demoPassword } })).status(),
    ).toBe(200);
    return api;
  }

  /** A tablet on the page's own clock, signed in as `email`, at `address`. */
  async function signedInPage(email: string, address: string) {
    const { ctx } = current();
    const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
    const page = await context.newPage();
    const problems = watchPage(page, ctx.baseUrl);
    await page.clock.install({ time: serverNowMs() });
    await signInThroughForm(page, ctx.baseUrl, email, demoPassword);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto(`${ctx.baseUrl}${address}`);
    return { page, problems };
  }

  async function nursePage(orderId: number) {
    // The bench is on the register before the page reads it (chooseDevice picks from it).
    await bench();
    const opened = await signedInPage('nurse@demo.luxtempo.example', `/sessions/${orderId}`);
    await opened.page.locator('h1', { hasText: 'Step clock' }).waitFor();
    return opened;
  }

  /**
   * Taps made earlier on another tablet, placed on the server's timeline `secondsAgo` before now.
   * A session start that names no device names the bench's, checked just now (`deviceFor`).
   */
  async function seedEvents(
    orderId: number,
    taps: [secondsAgo: number, body: Record<string, unknown>][],
  ) {
    const nowMs = serverNowMs();
    for (const [secondsAgo, tap] of taps) {
      const body =
        tap.type === 'session-started' && tap.device === undefined
          ? { ...tap, device: await deviceFor(orderId) }
          : tap;
      const res = await current().nurseApi.post(`/api/orders/${orderId}/session-events`, {
        data: {
          idempotencyKey: randomUUID(),
          clientTime: new Date(nowMs - secondsAgo * 1000).toISOString(),
          ...body,
        },
      });
      expect(res.status(), await res.text()).toBe(201);
    }
  }

  /** The session as the server holds it, read by someone who may read orders. */
  async function sessionOf<T>(orderId: number): Promise<T> {
    const res = await current().reader.get(`/api/orders/${orderId}/session`);
    expect(res.status()).toBe(200);
    return (await res.json()) as T;
  }

  async function allStored(page: Page) {
    await page.getByText('All taps stored').waitFor({ timeout: 15_000 });
  }

  /**
   * Name, date of birth and eye confirmed again in the dialog a light or UV start opens. With
   * `atMs` the confirmation (and so the start) is timed to the millisecond: the confirm button
   * takes keyboard focus, the clocks move to the moment, and Enter presses it.
   */
  async function confirmIdentity(page: Page, atMs?: number) {
    const dialog = page.getByRole('dialog', { name: /identity and eye again/ });
    await dialog.waitFor();
    for (const box of await dialog.getByRole('checkbox').all()) await box.check();
    const confirm = dialog.getByRole('button', { name: /^Confirmed: start/ });
    if (atMs === undefined) {
      await confirm.click();
    } else {
      await confirm.focus();
      await advance(page, atMs - serverNowMs());
      await page.keyboard.press('Enter');
    }
    await dialog.waitFor({ state: 'hidden' });
  }

  let benchMade: Promise<ClockBench> | null = null;
  /** The file's bench: a laser, a UV source and a lens of factor 1, added once by the device lead. */
  function bench() {
    benchMade ??= (async () => {
      const admin = await signedInApi('admin@demo.luxtempo.example');
      const add = async (urlPath: string, data: Record<string, unknown>, key: string) => {
        const res = await admin.post(urlPath, { data });
        expect(res.status(), await res.text()).toBe(201);
        return (await res.json())[key] as { id: number; name: string };
      };
      return {
        admin,
        laser: await add('/api/devices', deviceBody('laser'), 'device'),
        uv: await add('/api/devices', deviceBody('uv'), 'device'),
        // The clock tests' PDT orders type a laser-spot factor of 1.
        lens: await add(
          '/api/lenses',
          {
            name: `Clock test lens ${randomUUID().slice(0, 6)}`,
            laserSpotFactor: 1,
            imageMagnification: 1,
          },
          'lens',
        ),
      };
    })();
    return benchMade;
  }

  /** The bench's device and lens for an order, and the settings its plan asks for. */
  async function benchFor(orderId: number) {
    const made = await bench();
    const orderRes = await current().reader.get(`/api/orders/${orderId}`);
    expect(orderRes.status()).toBe(200);
    const { plan, inputs } = (await orderRes.json()).order as {
      plan: {
        powerMw: number | null;
        deviceSpotDiameterUm: number | null;
        irradianceMwPerCm2: number | null;
      };
      inputs: { lensId?: number };
    };
    if (plan.powerMw !== null)
      return {
        made,
        laser: true,
        setting: {
          deviceId: made.laser.id,
          powerSetMw: plan.powerMw,
          spotSetUm: plan.deviceSpotDiameterUm!,
          ...(inputs.lensId === undefined ? { lensId: made.lens.id } : {}),
        },
      };
    return {
      made,
      laser: false,
      setting: { deviceId: made.uv.id, irradianceSetMwPerCm2: plan.irradianceMwPerCm2! },
    };
  }

  /**
   * The `device` a seeded session start names for this order: the bench's laser or UV source
   * with a passing output check recorded now on the server's clock (a test may have moved it to
   * another day), set as the plan asks, and for a laser the bench's lens of factor 1.
   */
  async function deviceFor(orderId: number) {
    const { made, laser, setting } = await benchFor(orderId);
    const checked = await made.admin.post(`/api/devices/${setting.deviceId}/output-checks`, {
      data: laser
        ? { powerSetMw: 100, powerMeasuredMw: 100, ...testMeter }
        : { irradianceSetMwPerCm2: 3, irradianceMeasuredMwPerCm2: 3, ...testMeter },
    });
    expect(checked.status(), await checked.text()).toBe(201);
    return setting;
  }

  /**
   * On the step clock's pre-checks, as the nurse does: choose the bench's device, record its
   * output check in the form (a pass), type what is set on it from the plan, and for a laser name
   * the contact lens.
   */
  async function chooseDevice(page: Page, orderId: number) {
    const { laser, setting } = await benchFor(orderId);
    const unit = laser ? 'mW' : 'mW/cm²';
    await page
      .getByLabel(laser ? 'Laser used' : 'UV source used')
      .selectOption(String(setting.deviceId));
    await page.getByLabel(`Value set (${unit})`).fill(laser ? '100' : '3');
    await page.getByLabel(`Meter reading (${unit})`).fill(laser ? '99' : '3.05');
    await page.getByLabel('Meter identity').fill(testMeter.meterIdentity);
    await page
      .getByLabel('Meter calibration due (YYYY-MM-DD)')
      .fill(testMeter.meterCalibrationDueOn);
    await page.getByRole('button', { name: 'Record output check' }).click();
    await page
      .getByRole('status')
      .filter({ hasText: /^Passed:/ })
      .waitFor();
    if ('powerSetMw' in setting) {
      await page.getByLabel('Power set on the laser (mW)').fill(String(setting.powerSetMw));
      await page.getByLabel('Spot set on the laser (µm)').fill(String(setting.spotSetUm));
      if (setting.lensId !== undefined)
        await page.getByLabel('Contact lens on the eye').selectOption(String(setting.lensId));
    } else {
      await page
        .getByLabel('Irradiance set on the UV source (mW/cm²)')
        .fill(String(setting.irradianceSetMwPerCm2));
    }
  }

  return {
    serverNowMs,
    advance,
    deviceFor,
    chooseDevice,
    confirmIdentity,
    signedInApi,
    signedInPage,
    nursePage,
    seedEvents,
    sessionOf,
    allStored,
  };
}

interface ClockBench {
  admin: APIRequestContext;
  laser: { id: number; name: string };
  uv: { id: number; name: string };
  lens: { id: number; name: string };
}

/** Identity and eye said again before a light or UV step (`stepId`) starts, as a seeded tap. */
export const identityConfirmed = (stepId: string) => ({
  type: 'identity-confirmed',
  stepId,
  checks: { patientName: true, dateOfBirth: true, treatmentEye: true },
});

/** The five pre-treatment checks, all confirmed. */
export const allChecks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
};

/**
 * Orders made through the API as the order and pharmacy screens would make them, for clock tests:
 * a standard PDT order checked blind and prepared, or a signed CXL order (ready at once).
 */
export function clockOrders(
  current: () => { clinician: APIRequestContext; pharmacist: APIRequestContext },
  serverNowMs: () => number,
) {
  async function newPatient() {
    const suffix = randomUUID().slice(0, 6).toUpperCase();
    const res = await current().clinician.post('/api/patients', {
      data: {
        recordNumber: `SC-${suffix}`,
        givenName: 'Perpetua',
        familyName: `Lanternwick ${suffix}`,
        dateOfBirth: '1957-09-02',
        emailConsent: false,
      },
    });
    expect(res.status()).toBe(201);
    return (await res.json()).patient as { id: number; familyName: string };
  }

  async function signedOrder(body: Record<string, unknown>) {
    const draft = await current().clinician.post('/api/orders', { data: body });
    expect(draft.status(), await draft.text()).toBe(201);
    const { id, version } = (await draft.json()).order as { id: number; version: number };
    const signed = await current().clinician.post(`/api/orders/${id}/signature`, {
      data: { password: demoPassword, meaning: 'ordered', version },
    });
    expect(signed.status()).toBe(200);
    return id;
  }

  /** Standard PDT, 170 cm / 70 kg, GLD 2500 µm: checked blind and prepared, ready for the nurse. */
  async function preparedPdtOrder() {
    const patient = await newPatient();
    const id = await signedOrder({
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
      ].map((q) => ({ id: q, answer: 'no' })),
    });
    // Mosteller 1.82 m² (Mosteller RD, N Engl J Med 1987) × 6 mg/m² = 10.92 mg; 2 mg/mL → 5.46 mL (TAP Study Group, Arch Ophthalmol 1999).
    const check = await current().pharmacist.post(`/api/orders/${id}/dose-checks`, {
      data: { bsaM2: 1.82, doseMg: 10.92, drugVolumeMl: 5.46 },
    });
    expect(check.status(), await check.text()).toBe(201);
    const vialExpiry = new Date(Date.now() + 90 * 86_400_000).toISOString().slice(0, 10);
    // Made up 20 min before: the seeded infusion starts below lie up to 15 min back, and an infusion
    // before the reconstitution is refused.
    const reconstitutedAt = new Date(serverNowMs() - 20 * 60_000).toISOString();
    const prepared = await current().pharmacist.post(`/api/orders/${id}/preparation`, {
      data: { vialLot: 'SC-LOT-1', vialExpiry, reconstitutedAt, volumeDrawnMl: 5.5 },
    });
    expect(prepared.status(), await prepared.text()).toBe(201);
    return { id, patient };
  }

  /** A signed CXL order: ready for the session at once (no drug step to check). */
  async function readyCxlOrder(key = 'cxl-standard') {
    const patient = await newPatient();
    const id = await signedOrder({
      patientId: patient.id,
      eye: 'left',
      protocol: { key, version: 1 },
      // Version 1 is superseded by version 2; the figures here are version 1's.
      supersededVersionReason,
      inputs: { stromalThicknessUm: 460 },
      checklist: ['thin-stroma', 'active-infection', 'herpetic-keratitis'].map((q) => ({
        id: q,
        answer: 'no',
      })),
    });
    return { id, patient };
  }

  return { newPatient, preparedPdtOrder, readyCxlOrder };
}
