import { readFile } from 'node:fs/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoScenario } from '../../server/demo/scenario';
import { demoPassword } from '../../server/demo/seed';
import {
  accessibilityViolations,
  settledRows,
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

let ctx: BrowserContext;

beforeAll(async () => {
  ctx = await startBrowserTest();
  // The demo unit's history: finished sessions, two of them on standard PDT with the light started late.
  await seedDemoScenario(ctx.server.dataSource, 'Europe/Lisbon');
});
afterAll(async () => {
  await ctx?.close();
});

const csvHeader =
  'deviation_id,order_id,detected_at (ISO 8601),protocol,protocol_version,patient_record_number,eye,type,severity,expected,actual,unit,message,review_status,classification,reviewed_by,reviewed_at (ISO 8601),review_comment';

describe('the auditor reviews a deviation from the queue', () => {
  it('filters to one protocol, closes a late-light deviation with a classification and a comment, sees it closed, and finds it in the CSV', async () => {
    const context = await ctx.browser.newContext({
      viewport: { width: 1024, height: 768 },
      acceptDownloads: true,
    });
    const page = await context.newPage();
    const problems = watchPage(page, ctx.baseUrl);
    await signInThroughForm(page, ctx.baseUrl, 'auditor@demo.luxtempo.example', demoPassword);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();

    // The queue opens on open deviations of every protocol; the CXL history has some too.
    await page.getByRole('link', { name: 'Deviations', exact: true }).click();
    await page.getByRole('heading', { level: 1, name: 'Deviations' }).waitFor();
    await expect
      .poll(async () =>
        (await settledRows(page)).some((row) => row.includes('Corneal cross-linking')),
      )
      .toBe(true);

    // One protocol: the address keeps the filter, and only standard PDT remains (other browser
    // tests may have added their own PDT deviations to this database; the late light is among them).
    await page
      .getByLabel('Protocol', { exact: true })
      .selectOption({ label: 'Verteporfin PDT — standard' });
    await page.waitForURL(/[?&]protocol=pdt-standard(&|$)/);
    await expect
      .poll(async () => {
        const rows = await settledRows(page);
        return (
          rows.length > 0 &&
          rows.every((row) => row.includes('Verteporfin PDT — standard')) &&
          rows.some((row) => row.includes('Light started outside its window'))
        );
      })
      .toBe(true);
    // 3 min late: light due 15 min after the infusion start (TAP Study Group, Arch Ophthalmol 1999), demo session h02.
    const lateRow = page.locator('main table tbody tr').filter({ hasText: '18 min' });
    await expect.poll(() => lateRow.count()).toBe(1);
    expect(await lateRow.innerText()).toMatch(/Major/);
    expect(await lateRow.innerText()).toMatch(/Open/);
    expect(await accessibilityViolations(page)).toEqual([]);

    // The review screen: the deviation, the plan against what was given, and the timeline in unit time.
    await lateRow.getByRole('link', { name: 'Light started outside its window' }).click();
    await page.waitForURL(/\/deviations\/\d+$/);
    const deviationId = Number(/\/deviations\/(\d+)$/.exec(page.url())![1]);
    await page
      .getByRole('heading', {
        level: 1,
        name: `Deviation ${deviationId}: Light started outside its window`,
      })
      .waitFor();
    const departed = page.getByRole('region', { name: 'What departed from protocol' });
    await expect
      .poll(() => departed.innerText())
      .toMatch(/Expected\s+15 min\s+Actual\s+18 min\s+Difference\s+\+3 min/);
    // 600 mW/cm² for 83 s = 49.8 J/cm², planned and delivered (TAP Study Group, Arch Ophthalmol 1999).
    const figures = page.getByRole('region', { name: 'Plan and what was given' });
    await expect
      .poll(() => figures.innerText())
      .toMatch(/Light start after infusion start\s+15 min\s+18 min/);
    expect(await figures.innerText()).toMatch(/Fluence\s+49\.8 J\/cm²\s+49\.8 J\/cm²/);
    // The demo session starts at 10:05 unit time; the laser starts 1140 s later, named as the protocol names the step.
    const timeline = page.getByRole('region', { name: 'Session timeline' });
    await expect
      .poll(async () => (await timeline.innerText()).replace(/\s+/g, ' '))
      .toMatch(/At 10:24:00 WES?T , session time \+19:00 Started: Laser 600 mW\/cm² for 83 s/);
    expect(await page.getByRole('region', { name: 'Who took part' }).innerText()).toContain(
      'Ran the session (nurse)',
    );
    expect(await accessibilityViolations(page)).toEqual([]);

    // Closing needs a classification and a comment: nothing is sent without them.
    const review = page.getByRole('region', { name: 'Your review' });
    await review.getByRole('button', { name: 'Close the deviation' }).click();
    await review.getByText('Choose one classification').waitFor();
    expect(await review.getByLabel('Comment').getAttribute('aria-invalid')).toBe('true');

    const comment = 'Laser room was busy; raise the scheduling at the unit meeting.';
    await review.getByRole('radio', { name: 'Needs follow-up' }).check();
    await review.getByLabel('Comment').fill(comment);
    await review.getByRole('button', { name: 'Close the deviation' }).click();
    await page.getByText(`Deviation ${deviationId} closed as needs follow-up.`).waitFor();
    expect(await departed.innerText()).toMatch(/Closed/);
    const history = page.getByRole('region', { name: 'Review history' });
    await expect.poll(() => history.innerText()).toContain(comment);
    expect(await history.innerText()).toMatch(
      /Closed as needs follow-up\s+Marisol Quenby \(demo\)/,
    );
    // A closed deviation offers reopening instead of closing.
    await review.getByRole('button', { name: 'Reopen the deviation' }).waitFor();
    expect(await review.getByRole('button', { name: 'Close the deviation' }).count()).toBe(0);

    // Back in the queue, with its filter: it has left the open deviations and shows closed among all.
    await page.getByRole('link', { name: 'Back to the queue' }).click();
    await page.waitForURL(/[?&]protocol=pdt-standard(&|$)/);
    await expect
      .poll(async () => (await settledRows(page)).some((row) => row.includes('18 min')))
      .toBe(false);
    await page.getByLabel('Review status').selectOption({ label: 'Open or closed' });
    await page.waitForURL(/[?&]status=any(&|$)/);
    await expect
      .poll(async () => (await settledRows(page)).find((row) => row.includes('18 min')) ?? '')
      .toMatch(/Closed\s+Needs follow-up/);

    // The CSV of the current filter: the header with units, and the closed deviation with its judgement.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: /Download CSV/ }).click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/^luxtempo-deviations-\d{4}-\d{2}-\d{2}\.csv$/);
    expect(download.url()).toContain('protocol=pdt-standard');
    const csv = await readFile((await download.path())!, 'utf8');
    const lines = csv.split('\r\n').filter((line) => line !== '');
    expect(lines[0]).toBe(csvHeader);
    const row = lines.find((line) => line.startsWith(`${deviationId},`));
    expect(row).toBeDefined();
    // The demo orders use the newest shipped version of pdt-standard (3, with the device checks).
    expect(row).toMatch(/,pdt-standard,3,MP-100201,right,light-start-window,major,15,18,min,/);
    expect(row).toContain(`,closed,needs-follow-up,Marisol Quenby (demo),`);
    expect(row!.endsWith(`,${comment}`) || row!.endsWith(`,"${comment}"`)).toBe(true);
    expect(lines.slice(1).every((line) => line.includes(',pdt-standard,'))).toBe(true);

    expect(problems).toEqual([]);
    await context.close();
  });
});
