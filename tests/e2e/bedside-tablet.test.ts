import { mkdirSync } from 'node:fs';
import type { APIRequestContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { accessibilityViolations, startBrowserTest, type BrowserContext } from '../support/browser';
import { allChecks, clockKit, clockOrders, identityConfirmed } from '../support/clock-kit';

/*
 * The step clock on a 1024×768 landscape tablet: every primary action and the check that blocks a
 * start are on screen without scrolling in each kind of step, the eye badge stays inside its
 * header, and the bedside's own moments (identity again before the light, an early end, a missed
 * tap entered late, the after-care checklist, a due drop) work as a nurse meets them.
 */

let ctx: BrowserContext;
let clinician: APIRequestContext;
let pharmacist: APIRequestContext;
let nurseApi: APIRequestContext;

const unitZone = 'Europe/Lisbon';
const shots = process.env.BEDSIDE_SHOTS_DIR ?? null;

const {
  serverNowMs,
  advance,
  signedInApi,
  signedInPage,
  nursePage,
  seedEvents,
  sessionOf,
  allStored,
  confirmIdentity,
} = clockKit(() => ({ ctx, nurseApi, reader: clinician }));
const { preparedPdtOrder, readyCxlOrder } = clockOrders(
  () => ({ clinician, pharmacist }),
  serverNowMs,
);

beforeAll(async () => {
  ctx = await startBrowserTest({ UNIT_TIME_ZONE: unitZone });
  clinician = await signedInApi('clinician@demo.luxtempo.example');
  pharmacist = await signedInApi('pharmacist@demo.luxtempo.example');
  nurseApi = await signedInApi('nurse@demo.luxtempo.example');
  if (shots) mkdirSync(shots, { recursive: true });
});
afterAll(async () => {
  await Promise.all([clinician?.dispose(), pharmacist?.dispose(), nurseApi?.dispose()]);
  await ctx?.close();
});

interface StoredEvent {
  idempotencyKey: string;
  type: string;
  stepId?: string;
  clientTime: string;
  recordedBy: number;
  reason?: string;
  lateEntryReason?: string;
  item?: string;
}
const eventsOf = async (id: number) => (await sessionOf<{ events: StoredEvent[] }>(id)).events;

/** Wholly inside the 1024×768 window as it is, without scrolling. */
async function expectInViewport(page: Page, locator: Locator, what: string) {
  await locator.waitFor();
  const box = await locator.boundingBox();
  const view = page.viewportSize()!;
  expect(box, what).not.toBeNull();
  expect(box!.x, `${what}: left edge`).toBeGreaterThanOrEqual(0);
  expect(box!.y, `${what}: top edge`).toBeGreaterThanOrEqual(0);
  expect(box!.x + box!.width, `${what}: right edge`).toBeLessThanOrEqual(view.width);
  expect(box!.y + box!.height, `${what}: bottom edge`).toBeLessThanOrEqual(view.height);
}

/** The eye badge lies inside the clock's header and the window, never clipped. */
async function expectEyeBadgeWhole(page: Page) {
  const badge = page.locator('main [data-eye-badge]').first();
  const header = page.locator('main header').first();
  const [b, h] = [await badge.boundingBox(), await header.boundingBox()];
  expect(b).not.toBeNull();
  expect(h).not.toBeNull();
  expect(b!.x).toBeGreaterThanOrEqual(h!.x);
  expect(b!.y).toBeGreaterThanOrEqual(h!.y);
  expect(b!.x + b!.width).toBeLessThanOrEqual(h!.x + h!.width + 0.5);
  expect(b!.y + b!.height).toBeLessThanOrEqual(h!.y + h!.height + 0.5);
  // Nothing of the badge's words is cut off inside it either.
  const clipped = await badge.evaluate((el) => el.scrollWidth > el.clientWidth + 1);
  expect(clipped).toBe(false);
  await expectInViewport(page, badge, 'eye badge');
}

const button = (page: Page, name: string) =>
  page.getByRole('main').getByRole('button', { name, exact: true });

async function shoot(page: Page, name: string) {
  if (!shots) return;
  await page.screenshot({ path: `${shots}/${name}-1024x768.png` });
  await page.setViewportSize({ width: 1366, height: 900 });
  await page.waitForTimeout(200);
  await page.screenshot({ path: `${shots}/${name}-1366x900.png` });
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.waitForTimeout(200);
}

type Seed = [secondsAgo: number, body: Record<string, unknown>][];
const pdtStart: Seed = [
  [1100, { type: 'session-started', checks: allChecks }],
  [1099, { type: 'step-started', stepId: 'confirm-patient' }],
  [1098, { type: 'step-ended', stepId: 'confirm-patient' }],
];
const cxlStart: Seed = [
  [2400, { type: 'session-started', checks: allChecks }],
  [2399, { type: 'step-started', stepId: 'confirm-patient' }],
  [2398, { type: 'step-ended', stepId: 'confirm-patient' }],
  [2390, { type: 'step-started', stepId: 'epithelium-removal' }],
];

/** Each kind of step as the tablet meets it, the taps before it, and what must be on screen. */
const stepKinds: {
  name: string;
  kind: 'pdt' | 'cxl';
  seed: Seed;
  /** The buttons of the moment (exact names), or the check that blocks a start (its text). */
  buttons: string[];
  blocking?: RegExp;
}[] = [
  {
    name: 'pdt-infusion',
    kind: 'pdt',
    seed: [...pdtStart, [120, { type: 'step-started', stepId: 'infusion' }]],
    buttons: ['End infusion', 'Stop session…', 'Extravasation…', 'Missed tap…'],
  },
  {
    name: 'pdt-wait',
    kind: 'pdt',
    seed: [
      ...pdtStart,
      [800, { type: 'step-started', stepId: 'infusion' }],
      [200, { type: 'step-ended', stepId: 'infusion' }],
      [200, { type: 'step-started', stepId: 'wait-for-light' }],
    ],
    buttons: ['Start laser', 'Stop session…'],
  },
  {
    name: 'pdt-laser',
    kind: 'pdt',
    seed: [
      ...pdtStart,
      [960, { type: 'step-started', stepId: 'infusion' }],
      [360, { type: 'step-ended', stepId: 'infusion' }],
      [360, { type: 'step-started', stepId: 'wait-for-light' }],
      [61, identityConfirmed('laser')],
      [60, { type: 'step-ended', stepId: 'wait-for-light' }],
      [60, { type: 'step-started', stepId: 'laser' }],
    ],
    buttons: ['End laser', 'Pause laser', 'Stop session…'],
  },
  {
    name: 'pdt-aftercare',
    kind: 'pdt',
    seed: [
      ...pdtStart,
      [1000, { type: 'step-started', stepId: 'infusion' }],
      [400, { type: 'step-ended', stepId: 'infusion' }],
      [400, { type: 'step-started', stepId: 'wait-for-light' }],
      [101, identityConfirmed('laser')],
      [100, { type: 'step-ended', stepId: 'wait-for-light' }],
      [100, { type: 'step-started', stepId: 'laser' }],
      [17, { type: 'step-ended', stepId: 'laser' }],
      [15, { type: 'exposure-recorded', stepId: 'laser', exposureS: 83 }],
      [10, { type: 'step-started', stepId: 'aftercare' }],
    ],
    buttons: ['Complete session', 'Advice given', 'Sheet printed', 'Contact number given'],
  },
  {
    name: 'cxl-preparation',
    kind: 'cxl',
    seed: cxlStart,
    buttons: ['Start soak', 'Stop session…', 'Missed tap…'],
  },
  {
    name: 'cxl-soak-drop-due',
    kind: 'cxl',
    seed: [
      ...cxlStart,
      // Soak 1000 s in, drops every 2 min until 160 s ago: one is due (Wollensak G et al., Am J Ophthalmol 2003).
      [1000, { type: 'step-ended', stepId: 'epithelium-removal' }],
      [1000, { type: 'step-started', stepId: 'riboflavin-soak' }],
      ...Array.from(
        { length: 7 },
        (_, i) =>
          [1000 - (i + 1) * 120, { type: 'drop-given', stepId: 'riboflavin-soak' }] as Seed[number],
      ),
    ],
    buttons: ['Drop given', 'End soak', 'Stop session…'],
  },
  {
    name: 'cxl-thickness-blocked',
    kind: 'cxl',
    seed: [
      ...cxlStart,
      [2300, { type: 'step-ended', stepId: 'epithelium-removal' }],
      [2300, { type: 'step-started', stepId: 'riboflavin-soak' }],
      [500, { type: 'step-ended', stepId: 'riboflavin-soak' }],
      [500, { type: 'step-started', stepId: 'thickness-check' }],
    ],
    buttons: ['Record reading', 'Stop session…'],
    blocking: /Record the thinnest stromal thickness first/,
  },
  {
    name: 'cxl-swelling',
    kind: 'cxl',
    seed: [
      ...cxlStart,
      [2300, { type: 'step-ended', stepId: 'epithelium-removal' }],
      [2300, { type: 'step-started', stepId: 'riboflavin-soak' }],
      [500, { type: 'step-ended', stepId: 'riboflavin-soak' }],
      [500, { type: 'step-started', stepId: 'thickness-check' }],
      // 380 µm is below the 400 µm minimum (Spoerl E et al., Cornea 2007): swelling comes next.
      [480, { type: 'thickness-measured', stepId: 'thickness-check', thicknessUm: 380 }],
      [470, { type: 'step-started', stepId: 'stromal-swelling' }],
    ],
    buttons: ['Drop given', 'Record reading', 'Authorise UV override…'],
    blocking: /UV starts only after a reading of at least 400 µm/,
  },
  {
    name: 'cxl-uv',
    kind: 'cxl',
    seed: [
      ...cxlStart,
      [2300, { type: 'step-ended', stepId: 'epithelium-removal' }],
      [2300, { type: 'step-started', stepId: 'riboflavin-soak' }],
      [500, { type: 'step-ended', stepId: 'riboflavin-soak' }],
      [500, { type: 'step-started', stepId: 'thickness-check' }],
      [480, { type: 'thickness-measured', stepId: 'thickness-check', thicknessUm: 450 }],
      [470, identityConfirmed('uv-exposure')],
      [460, { type: 'step-started', stepId: 'uv-exposure' }],
    ],
    buttons: ['Drop given', 'End UV', 'Pause UV', 'Stop session…'],
  },
];

describe('on a 1024×768 tablet', () => {
  for (const step of stepKinds) {
    it(`${step.name}: every primary action${step.blocking ? ' and the check that blocks the start' : ''} is in view without scrolling, the eye badge whole, no axe violation`, async () => {
      const { id } = step.kind === 'pdt' ? await preparedPdtOrder() : await readyCxlOrder();
      await seedEvents(id, step.seed);
      const { page, problems } = await nursePage(id);
      await page.getByRole('timer').first().waitFor();
      await shoot(page, step.name);
      for (const name of step.buttons) await expectInViewport(page, button(page, name), name);
      if (step.blocking)
        await expectInViewport(
          page,
          page.getByRole('main').getByText(step.blocking).first(),
          'the check that blocks the start',
        );
      expect(await page.evaluate(() => window.scrollY)).toBe(0);
      await expectEyeBadgeWhole(page);
      // The date of birth the identity checks ask for, as the unit writes it (day/month/year).
      await expectInViewport(page, page.getByText('02/09/1957'), 'date of birth');
      expect(await accessibilityViolations(page)).toEqual([]);
      expect(problems).toEqual([]);
      await page.context().close();
    });
  }
});

describe('before the session on a 1024×768 tablet', () => {
  it('the start and what still blocks it stay in view without scrolling, however long the checks run', async () => {
    const { id } = await readyCxlOrder();
    const { page, problems } = await nursePage(id);
    const start = button(page, 'Start session');
    await expectInViewport(page, start, 'Start session');
    await start.click();
    await expectInViewport(
      page,
      page.getByRole('main').getByText('The session cannot start yet'),
      'the check that blocks the start',
    );
    await expectInViewport(page, start, 'Start session, with the refusal above it');
    expect(await page.evaluate(() => window.scrollY)).toBe(0);
    await expectEyeBadgeWhole(page);
    expect(await accessibilityViolations(page)).toEqual([]);
    expect(problems).toEqual([]);
    await page.context().close();
  });
});

describe('the bedside moments', () => {
  it('the laser starts only after name, date of birth and eye are confirmed again, stored with who and when', async () => {
    const { id } = await preparedPdtOrder();
    await seedEvents(id, stepKinds.find((s) => s.name === 'pdt-wait')!.seed);
    const { page, problems } = await nursePage(id);
    await button(page, 'Start laser').click();
    const dialog = page.getByRole('dialog', { name: 'Before the laser: identity and eye again' });
    await dialog.waitFor();
    expect(await dialog.innerText()).toMatch(/Date of birth: 02\/09\/1957/);
    expect(await dialog.innerText()).toMatch(/RIGHT/);
    await dialog.getByRole('button', { name: 'Confirmed: start laser' }).click();
    await dialog.getByText('The laser cannot start yet').waitFor();
    expect(await accessibilityViolations(page)).toEqual([]);
    if (shots) await page.screenshot({ path: `${shots}/pdt-identity-dialog-1024x768.png` });
    expect(
      (await eventsOf(id)).some((e) => e.type === 'step-started' && e.stepId === 'laser'),
    ).toBe(false);
    await confirmIdentity(page);
    await page.getByRole('timer', { name: 'Time left for the laser' }).waitFor();
    await allStored(page);
    const events = await eventsOf(id);
    const confirmed = events.findIndex((e) => e.type === 'identity-confirmed');
    const started = events.findIndex((e) => e.type === 'step-started' && e.stepId === 'laser');
    expect(confirmed).toBeGreaterThanOrEqual(0);
    expect(confirmed).toBeLessThan(started);
    expect(events[confirmed]!.recordedBy).toBeGreaterThan(0);
    expect(Date.parse(events[confirmed]!.clientTime)).toBeLessThanOrEqual(
      Date.parse(events[started]!.clientTime),
    );
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('a soak ended at 4 of 30 min asks first and keeps the reason; Drop given is the large button and a due drop is unmistakable', async () => {
    const { id } = await readyCxlOrder();
    await seedEvents(id, [
      ...cxlStart,
      [250, { type: 'step-ended', stepId: 'epithelium-removal' }],
      [250, { type: 'step-started', stepId: 'riboflavin-soak' }],
    ]);
    const { page, problems } = await nursePage(id);
    // 250 s into a soak with a drop every 2 min (Wollensak G et al., Am J Ophthalmol 2003): a drop is due.
    const due = page.locator('[data-drop-due]');
    await due.waitFor();
    expect(await due.innerText()).toMatch(/Drop due/i);
    const dueBox = (await due.boundingBox())!;
    expect(dueBox.height).toBeGreaterThanOrEqual(56);
    const dropBox = (await button(page, 'Drop given').boundingBox())!;
    const endBox = (await button(page, 'End soak').boundingBox())!;
    expect(dropBox.width * dropBox.height).toBeGreaterThan(endBox.width * endBox.height);
    // The frame beats only where motion is welcome.
    const frame = due.locator('span[aria-hidden="true"]').first();
    expect(await frame.evaluate((el) => getComputedStyle(el).animationName)).not.toBe('none');
    await page.emulateMedia({ reducedMotion: 'reduce' });
    expect(await frame.evaluate((el) => getComputedStyle(el).animationName)).toBe('none');
    expect(await accessibilityViolations(page)).toEqual([]);
    await button(page, 'Drop given').click();
    await due.waitFor({ state: 'hidden' });

    await advance(page, 1_000);
    await button(page, 'End soak').click();
    const dialog = page.getByRole('dialog', { name: 'End the soak early?' });
    await dialog.waitFor();
    expect(await dialog.innerText()).toMatch(/has run 0?4:\d\d of 30:00/);
    await dialog.getByRole('button', { name: 'End soak early' }).click();
    await dialog.getByText(/Give a reason of 5 to 500 characters/).waitFor();
    expect(
      (await eventsOf(id)).some((e) => e.type === 'step-ended' && e.stepId === 'riboflavin-soak'),
    ).toBe(false);
    await dialog.getByLabel('Why does the soak end early?').fill('Patient could not keep still.');
    await dialog.getByRole('button', { name: 'End soak early' }).click();
    await button(page, 'Start thickness check').waitFor();
    await allStored(page);
    const end = (await eventsOf(id)).find(
      (e) => e.type === 'step-ended' && e.stepId === 'riboflavin-soak',
    );
    expect(end?.reason).toBe('Patient could not keep still.');
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it('a missed drop is entered at its real time with a reason, and the order page lists it as a late entry', async () => {
    const { id } = await readyCxlOrder();
    await seedEvents(id, [
      ...cxlStart,
      [400, { type: 'step-ended', stepId: 'epithelium-removal' }],
      [400, { type: 'step-started', stepId: 'riboflavin-soak' }],
      [150, { type: 'drop-given', stepId: 'riboflavin-soak' }],
    ]);
    const { page, problems } = await nursePage(id);
    const missedMs = Math.floor((serverNowMs() - 280_000) / 1000) * 1000;
    const wardTime = new Intl.DateTimeFormat('en-GB', {
      timeZone: unitZone,
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
      hourCycle: 'h23',
    }).format(new Date(missedMs));
    await button(page, 'Missed tap…').click();
    const dialog = page.getByRole('dialog', { name: 'Record a missed tap' });
    await dialog
      .getByLabel('What was missed')
      .selectOption({ label: 'A drop given in the running soak' });
    // A time in the future is refused on the tablet already.
    const future = new Intl.DateTimeFormat('en-GB', {
      timeZone: unitZone,
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    }).format(new Date(serverNowMs() + 3_600_000));
    await dialog.getByLabel('When it happened (ward clock)').fill(future);
    await dialog
      .getByLabel('Why is it entered late?')
      .fill('Drop given; the tap was missed while holding the lid.');
    await dialog.getByRole('button', { name: 'Record late entry' }).click();
    await dialog.getByText('The time is in the future').waitFor();
    expect(await accessibilityViolations(page)).toEqual([]);
    if (shots) await page.screenshot({ path: `${shots}/cxl-late-entry-dialog-1024x768.png` });
    await dialog.getByLabel('When it happened (ward clock)').fill(wardTime);
    await dialog.getByRole('button', { name: 'Record late entry' }).click();
    await dialog.waitFor({ state: 'hidden' });
    const late = (await eventsOf(id)).find((e) => e.lateEntryReason !== undefined);
    expect(late).toMatchObject({
      type: 'drop-given',
      stepId: 'riboflavin-soak',
      lateEntryReason: 'Drop given; the tap was missed while holding the lid.',
    });
    expect(Date.parse(late!.clientTime)).toBe(missedMs);
    expect(problems).toEqual([]);
    await page.context().close();

    const watcher = await signedInPage('clinician@demo.luxtempo.example', `/orders/${id}`);
    await watcher.page.getByRole('heading', { name: 'Late entries' }).waitFor();
    expect(await watcher.page.getByRole('main').innerText()).toMatch(
      /Late entry:\s*drop, timed[\s\S]*Reason: Drop given; the tap was missed while holding the lid\./,
    );
    await watcher.page.context().close();
  });

  it('after-care is a checklist recorded tap by tap, with the way to the discharge sheet', async () => {
    const { id } = await preparedPdtOrder();
    await seedEvents(id, stepKinds.find((s) => s.name === 'pdt-aftercare')!.seed);
    const { page, problems } = await nursePage(id);
    const list = page.getByRole('region', { name: 'After-care checklist' });
    await list.waitFor();
    await list.getByRole('button', { name: 'Advice given' }).click();
    await list.getByRole('button', { name: 'Sheet e-mailed' }).click();
    await list.getByRole('button', { name: 'Contact number given' }).click();
    await expect.poll(() => list.getByRole('button').count()).toBe(0);
    expect(await list.innerText()).toMatch(/Light and after-care advice given/);
    await expectInViewport(
      page,
      list.getByRole('link', { name: 'Open the discharge sheet' }),
      'discharge sheet',
    );
    await allStored(page);
    expect(
      (await eventsOf(id)).filter((e) => e.type === 'aftercare-checked').map((e) => e.item),
    ).toEqual(['advice', 'sheet-emailed', 'contact-number']);
    expect(await accessibilityViolations(page)).toEqual([]);
    await shoot(page, 'pdt-aftercare-done');
    expect(
      await list.getByRole('link', { name: 'Open the discharge sheet' }).getAttribute('href'),
    ).toBe(`/orders/${id}/discharge`);
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
