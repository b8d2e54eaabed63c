import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoScenario } from '../../server/demo/scenario';
import { demoPassword } from '../../server/demo/seed';
import {
  accessibilityViolations,
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

/*
 * A clinician records a follow-up visit from the patient's history, with the acuity as the
 * clinic wrote it (Snellen in feet), and reads it back in logMAR beside the entry.
 */

let ctx: BrowserContext;

beforeAll(async () => {
  ctx = await startBrowserTest();
  await seedDemoScenario(ctx.server.dataSource, 'Europe/Lisbon');
});
afterAll(async () => {
  await ctx?.close();
});

describe('follow-up from the patient’s history', () => {
  it('records a visit with acuity in feet and shows it in logMAR', async () => {
    // MP-100203: a standard PDT session five days ago in the demo history (h11).
    const [patient] = await ctx.server.dataSource.query(
      "SELECT id FROM patient WHERE record_number = 'MP-100203'",
    );
    const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
    const page = await context.newPage();
    const problems = watchPage(page, ctx.baseUrl);
    await signInThroughForm(page, ctx.baseUrl, 'clinician@demo.luxtempo.example', demoPassword);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto(`${ctx.baseUrl}/patients/${patient.id}`);
    await page.getByRole('heading', { name: 'Follow-up and complications' }).waitFor();

    // The first visit still open (the baseline on a fresh database).
    const record = page.getByRole('button', { name: /^Record / }).first();
    await record.waitFor();
    const label = ((await record.textContent()) ?? '').replace(/^Record /, '').trim();
    await record.click();
    const form = page.getByRole('form', { name: `Record the ${label} visit` });
    await form.getByLabel('Acuity written as').selectOption('snellen-ft');
    await form.getByLabel('Best-corrected acuity').fill('20/40');
    // 20/40 = decimal 0.5 → logMAR 0.30 → 70 letters (Gregori NZ et al., Retina 2010).
    await form.getByText('Stored as: logMAR = −log10(20/40) = 0.30 · 70 letters').waitFor();
    await form.getByLabel('Central subfield thickness (µm)').fill('380');
    await form.getByLabel('Subretinal fluid').selectOption('present');
    expect(await accessibilityViolations(page)).toEqual([]);
    await form.getByRole('button', { name: 'Record visit' }).click();
    await form.waitFor({ state: 'detached' });

    const row = page.getByRole('row', { name: new RegExp(`^${label}`) }).first();
    await expect.poll(() => row.innerText()).toContain('logMAR 0.30');
    expect(await row.innerText()).toContain('entered 20/40 · 70 letters');
    expect(await row.innerText()).toContain('Recorded');
    expect(problems).toEqual([]);
    await context.close();
  });
});
