import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoScenario } from '../../server/demo/scenario';
import { demoPassword } from '../../server/demo/seed';
import { startBrowserTest, watchPage, type BrowserContext } from '../support/browser';

/*
 * The records as the staff read them: the nurse prints a dose record from the order, the light
 * calculator answers from two figures typed with a decimal comma, and the audit trail is filtered
 * by a person's name.
 */

let ctx: BrowserContext;
let pdtOrderId = 0;

beforeAll(async () => {
  ctx = await startBrowserTest();
  await seedDemoScenario(ctx.server.dataSource, 'Europe/Lisbon');
  const [row] = await ctx.server.dataSource.query(
    "SELECT o.id FROM treatment_order o JOIN dose_record r ON r.order_id = o.id JOIN protocol_version pv ON pv.id = o.protocol_version_id WHERE r.outcome = 'completed' AND pv.protocol_key = 'pdt-standard' ORDER BY o.id LIMIT 1",
  );
  pdtOrderId = Number(row.id);
});
afterAll(async () => {
  await ctx?.close();
});

async function signedInPage(role: string) {
  const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
  const signIn = await context.request.post(`${ctx.baseUrl}/api/auth/login`, {
    headers: { origin: ctx.baseUrl },
    data: { email: `${role}@demo.luxtempo.example`, password: demoPassword },
  });
  expect(signIn.ok()).toBe(true);
  const page = await context.newPage();
  return { page, problems: watchPage(page, ctx.baseUrl) };
}

describe('the printed dose record', () => {
  it('opens from the nurse’s order page as the record alone, with who ran it, the birth date, the device, pauses and a place to sign; the app header never prints', async () => {
    const { page, problems } = await signedInPage('nurse');
    await page.goto(`${ctx.baseUrl}/orders/${pdtOrderId}`);
    await page.getByRole('link', { name: 'Print dose record' }).click();
    await page.waitForURL(`**/dose-records/${pdtOrderId}/print`);
    await page.getByRole('heading', { name: 'Plan and what was given' }).waitFor();

    const text = await page.locator('main').innerText();
    expect(text).toMatch(/Session run by\s*\S+/);
    // The unit's locale is en-GB: a birth date reads day/month/year.
    expect(text).toMatch(/Born \d{2}\/\d{2}\/\d{4}/);
    expect(text).toContain('Device settings');
    expect(text).toContain('Spot set on the laser');
    expect(text).toContain('Pauses');
    expect(text).toContain('Verification');
    // Light times read from the infusion start, as the protocol states them (TAP Study Group 1999).
    expect(text).toContain('From infusion start');
    expect(text).toMatch(
      /Light started\s+\d{2}:\d{2}:\d{2}(\s+[A-Z][A-Za-z+−\-\d]{1,8})?\s+\+1[456]:\d{2}/,
    );
    expect(text).not.toMatch(/for auditors/i);

    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('banner').isVisible()).toBe(false);
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
    expect(await page.getByRole('heading', { name: 'Verification' }).isVisible()).toBe(true);
    expect(problems).toEqual([]);
    await page.context().close();
  });
});

describe('the light calculator', () => {
  it('answers the time from fluence and irradiance typed with a decimal comma, and leaves the rest empty', async () => {
    const { page, problems } = await signedInPage('nurse');
    await page.goto(`${ctx.baseUrl}/light-calculator`);
    await page.getByLabel('Fluence (J/cm²)').fill('49,8');
    await page.getByLabel('Irradiance (mW/cm²)').fill('600');
    await page.getByRole('button', { name: 'Calculate' }).click();

    // 49.8 J/cm² at 600 mW/cm² → 83 s (TAP Study Group, Arch Ophthalmol 1999).
    const exposure = page.getByRole('row', { name: /Exposure time/ });
    await expect.poll(() => exposure.innerText()).toMatch(/83\s/);
    expect(await page.getByRole('row', { name: /^Power/ }).innerText()).toContain(
      'Not fixed by your figures',
    );
    expect(problems).toEqual([]);
    await page.context().close();
  });
});

describe('the audit trail', () => {
  it('filters by a person chosen by name, and shows details as labelled values', async () => {
    const { page, problems } = await signedInPage('auditor');
    await page.goto(`${ctx.baseUrl}/audit-trail`);
    const doneBy = page.getByLabel('Done by');
    // The auditor's own sign-in is on the trail; she is picked by her name, not an id.
    const option = doneBy.locator('option', { hasText: 'Marisol' }).first();
    await doneBy.selectOption({ label: await option.innerText() });
    await page.waitForURL(/actor=\d+/);
    await expect
      .poll(async () => {
        const rows = await page.locator('tbody tr').allInnerTexts();
        return rows.length > 0 && rows.every((row) => row.includes('Marisol'));
      })
      .toBe(true);
    const main = await page.locator('main').innerText();
    expect(main).not.toMatch(/[{}"]/);
    expect(main).not.toMatch(/\bbsaM2\b|\bdrugVolumeMl\b/);
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
