import { randomUUID } from 'node:crypto';
import { chromium } from 'playwright-core';
import { demoPassword } from '../demo/seed';
import { benchUvSource, benchVersionReason } from './bench-open-loop';

const uvDurationS = 1800; // cxl-standard: 3 mW/cm² for 30 min (Wollensak G, Spoerl E, Seiler T, Am J Ophthalmol 2003)

async function api(base: string, cookie: string, method: string, path: string, body?: unknown) {
  const res = await fetch(`${base}/api${path}`, {
    method,
    headers: { Cookie: cookie, 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const json = (await res.json()) as Record<string, any>;
  if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${JSON.stringify(json)}`);
  return json;
}

async function signIn(base: string, role: string) {
  const res = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: `${role}@demo.luxtempo.example`, password: demoPassword }),
  });
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

/**
 * The step clock after a 30-minute step in a tab that was asleep: a CXL session whose UV step began
 * almost 30 minutes ago is open in the browser; the tab is frozen (as a sleeping tablet or a
 * background tab is), woken, and the clock's own figure is compared with the true schedule.
 * Error = |remaining time the clock worked out − (true end − the device's time at that moment)|.
 * Staleness (how old the shown frame is when read) is reported beside it; the screen refreshes at
 * least every 250 ms and exactly at each change of the shown second.
 */
export async function measureClockError(base: string) {
  const clinician = await signIn(base, 'clinician');
  const nurse = await signIn(base, 'nurse');
  const patient = await api(base, clinician, 'POST', '/patients', {
    recordNumber: `C-${randomUUID().slice(0, 8)}`,
    givenName: 'Clock',
    familyName: 'Bench',
    dateOfBirth: '1970-01-01',
  });
  const draft = await api(base, clinician, 'POST', '/orders', {
    patientId: patient.patient.id,
    eye: 'left',
    protocol: { key: 'cxl-standard', version: 1 },
    inputs: { stromalThicknessUm: 470 },
    checklist: ['thin-stroma', 'active-infection', 'herpetic-keratitis'].map((id) => ({
      id,
      answer: 'no',
    })),
    supersededVersionReason: benchVersionReason,
  });
  const orderId = draft.order.id;
  await api(base, clinician, 'POST', `/orders/${orderId}/signature`, {
    password: demoPassword,
    meaning: 'ordered',
    version: draft.order.version,
  });
  const uvStartMs = Date.now() - (uvDurationS - 25) * 1000;
  const at = (msBeforeUv: number) => new Date(uvStartMs - msBeforeUv).toISOString();
  const events = [
    {
      type: 'session-started',
      clientTime: at(2_000_000),
      checks: {
        patientIdentity: true,
        treatmentEye: true,
        consent: true,
        eyewear: true,
        deviceSettings: true,
      },
      device: await benchUvSource(base),
    },
    { type: 'step-started', stepId: 'riboflavin-soak', clientTime: at(1_900_000) },
    ...Array.from({ length: 15 }, (_, i) => ({
      type: 'drop-given',
      stepId: 'riboflavin-soak',
      clientTime: at(1_900_000 - (i + 1) * 120_000),
    })),
    { type: 'step-ended', stepId: 'riboflavin-soak', clientTime: at(100_000) },
    { type: 'step-started', stepId: 'thickness-check', clientTime: at(90_000) },
    {
      type: 'thickness-measured',
      stepId: 'thickness-check',
      thicknessUm: 452,
      clientTime: at(60_000),
    },
    {
      type: 'identity-confirmed',
      stepId: 'uv-exposure',
      checks: { patientName: true, dateOfBirth: true, treatmentEye: true },
      clientTime: at(10_000),
    },
    { type: 'step-ended', stepId: 'thickness-check', clientTime: at(1) },
    { type: 'step-started', stepId: 'uv-exposure', clientTime: new Date(uvStartMs).toISOString() },
  ];
  for (const e of events)
    await api(base, nurse, 'POST', `/orders/${orderId}/session-events`, {
      idempotencyKey: randomUUID(),
      ...e,
    });
  const uvEndMs = uvStartMs + uvDurationS * 1000;

  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
  try {
    const context = await browser.newContext({ viewport: { width: 1024, height: 768 } });
    await context.request.post(`${base}/api/auth/login`, {
      headers: { origin: base },
      data: { email: 'nurse@demo.luxtempo.example', password: demoPassword },
    });
    const page = await context.newPage();
    await page.goto(`${base}/sessions/${orderId}`);
    const timer = page.locator('[role="timer"][data-exact-ms]');
    await timer.waitFor({ timeout: 15_000 });
    const cdp = await context.newCDPSession(page);
    await cdp.send('Page.setWebLifecycleState', { state: 'frozen' });
    await new Promise((r) => setTimeout(r, 10_000));
    await cdp.send('Page.setWebLifecycleState', { state: 'active' });

    const readings: { errorMs: number; staleMs: number; offsetMs: number }[] = [];
    const until = Date.now() + 3000;
    while (Date.now() < until) {
      const r = await timer.evaluate((el) => ({
        exactMs: Number(el.getAttribute('data-exact-ms')),
        serverNowMs: Number(el.getAttribute('data-server-now-ms')),
        deviceNowMs: Number(el.getAttribute('data-device-now-ms')),
        readAtMs: Date.now(),
      }));
      readings.push({
        errorMs: Math.abs(r.exactMs - (uvEndMs - r.deviceNowMs)),
        staleMs: r.readAtMs - r.deviceNowMs,
        offsetMs: r.serverNowMs - r.deviceNowMs,
      });
      await new Promise((res) => setTimeout(res, 97));
    }
    const max = (k: keyof (typeof readings)[number]) =>
      Math.round(Math.max(...readings.map((x) => Math.abs(x[k]))) * 10) / 10;
    const result = {
      maxErrorMs: max('errorMs'),
      maxStaleMs: max('staleMs'),
      maxOffsetMs: max('offsetMs'),
      readings: readings.length,
      frozenForS: 10,
      stepRunS: uvDurationS - 25 + 10,
    };
    console.log(
      `step clock             max error ${result.maxErrorMs} ms after a ${result.stepRunS} s step with the tab frozen ${result.frozenForS} s (frame age up to ${result.maxStaleMs} ms, offset estimate up to ${result.maxOffsetMs} ms; ${result.readings} readings)`,
    );
    return result;
  } finally {
    await browser.close();
  }
}
