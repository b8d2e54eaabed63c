import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoHistory, seedDemoScenario } from '../../server/demo/scenario';
import { demoPassword } from '../../server/demo/seed';
import {
  accessibilityViolations,
  settledRows,
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

/*
 * The dose records list as an auditor uses it: sorting by a column header from the keyboard,
 * paging, and the date and protocol filters. The list is sorted and paged by the server; the
 * screen only asks, so every step is checked in the address, the headers and the rows together.
 */

let ctx: BrowserContext;

beforeAll(async () => {
  ctx = await startBrowserTest();
  // Every demo history item is a completed session, so each one is a dose record.
  await seedDemoScenario(ctx.server.dataSource, 'Europe/Lisbon');
});
afterAll(async () => {
  await ctx?.close();
});

/**
 * The delivered fluence of each row that has one, in J/cm², in the order shown. Sessions stopped
 * before any light (other browser tests leave some in this database) have none.
 */
async function deliveredFluences(page: Page): Promise<number[]> {
  const rows = await settledRows(page);
  return rows
    .map((row) => /([\d.]+) J\/cm² delivered/.exec(row)?.[1])
    .filter((figure) => figure !== undefined)
    .map(Number);
}

function searchParam(page: Page, name: string): string | null {
  return new URL(page.url()).searchParams.get(name);
}

describe('the auditor reads the dose records', () => {
  it('sorts by fluence from the keyboard, pages through ten at a time, and filters by dates and protocol', async () => {
    const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
    const page = await context.newPage();
    const problems = watchPage(page, ctx.baseUrl);
    await signInThroughForm(page, ctx.baseUrl, 'auditor@demo.luxtempo.example', demoPassword);
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Dose records', exact: true })
      .click();
    await page.getByRole('heading', { level: 1, name: 'Dose records' }).waitFor();
    await expect.poll(async () => (await settledRows(page)).length).toBeGreaterThan(0);

    // Newest first by default: the headers say so, and only the server's sort keys get a button.
    const header = (name: string) => page.getByRole('columnheader', { name, exact: true });
    expect(await header('Ended').getAttribute('aria-sort')).toBe('descending');
    expect(await header('Fluence').getAttribute('aria-sort')).toBe('none');
    expect(await header('Session').getAttribute('aria-sort')).toBeNull();
    expect(await header('Session').getByRole('button').count()).toBe(0);

    // Sorting by fluence from the keyboard; the header, the address and the rows agree.
    const fluenceButton = page.getByRole('button', { name: 'Fluence', exact: true });
    await fluenceButton.focus();
    await page.keyboard.press('Enter');
    await page.waitForURL(/[?&]sort=fluence(&|$)/);
    const firstDirection = searchParam(page, 'direction') ?? 'desc';
    const ariaFor = (direction: string) => (direction === 'asc' ? 'ascending' : 'descending');
    await expect
      .poll(() => header('Fluence').getAttribute('aria-sort'))
      .toBe(ariaFor(firstDirection));
    expect(await header('Ended').getAttribute('aria-sort')).toBe('none');
    const inOrder = (values: number[], direction: string) =>
      values.every(
        (v, i) => i === 0 || (direction === 'asc' ? values[i - 1]! <= v : values[i - 1]! >= v),
      );
    await expect
      .poll(async () => {
        const values = await deliveredFluences(page);
        return values.length > 0 && inOrder(values, firstDirection);
      })
      .toBe(true);

    // A second press turns the order round.
    await page.keyboard.press('Enter');
    const secondDirection = firstDirection === 'asc' ? 'desc' : 'asc';
    await expect.poll(() => searchParam(page, 'direction') ?? 'desc').toBe(secondDirection);
    await expect
      .poll(() => header('Fluence').getAttribute('aria-sort'))
      .toBe(ariaFor(secondDirection));
    await expect
      .poll(async () => {
        const values = await deliveredFluences(page);
        return values.length > 0 && inOrder(values, secondDirection);
      })
      .toBe(true);

    // Ten a page: more records than that exist (the demo history alone has more), so there is a second page.
    const pager = page.getByRole('navigation', { name: 'Pages of dose records' });
    await pager.getByLabel('Records per page').selectOption('10');
    await page.waitForURL(/[?&]pageSize=10(&|$)/);
    await expect.poll(async () => (await settledRows(page)).length).toBe(10);
    const firstPage = /^Records 1–10 of (\d+) · page 1 of (\d+)$/.exec(
      (await pager.getByRole('status').innerText()).trim(),
    );
    expect(firstPage).not.toBeNull();
    const total = Number(firstPage![1]);
    expect(total).toBeGreaterThanOrEqual(demoHistory.length);
    expect(Number(firstPage![2])).toBe(Math.ceil(total / 10));
    expect(await pager.getByRole('button', { name: 'Previous page' }).isDisabled()).toBe(true);

    await pager.getByRole('button', { name: 'Next page' }).click();
    await page.waitForURL(/[?&]page=2(&|$)/);
    await expect.poll(async () => (await settledRows(page)).length).toBe(Math.min(10, total - 10));
    expect((await pager.getByRole('status').innerText()).trim()).toBe(
      `Records 11–${Math.min(20, total)} of ${total} · page 2 of ${Math.ceil(total / 10)}`,
    );
    expect(await pager.getByRole('button', { name: 'Previous page' }).isDisabled()).toBe(false);
    expect(await accessibilityViolations(page)).toEqual([]);

    // A reversed date range is named on the "from" date at once.
    const filters = page.getByRole('form', { name: 'Filter the dose records' });
    await filters.getByLabel('Ended to').fill('2024-03-01');
    await filters.getByLabel('Ended from').fill('2024-03-02');
    await expect
      .poll(() => filters.getByLabel('Ended from').getAttribute('aria-invalid'))
      .toBe('true');
    await filters
      .getByText('The “from” date is after the “to” date, so nothing can match.')
      .waitFor();
    await filters.getByRole('button', { name: 'Clear filters' }).click();
    await expect
      .poll(() => filters.getByLabel('Ended from').getAttribute('aria-invalid'))
      .toBeNull();

    // The version select waits for a protocol, then offers that protocol's versions.
    const version = filters.getByLabel('Protocol version');
    expect(await version.isDisabled()).toBe(true);
    await filters
      .getByLabel('Protocol', { exact: true })
      .selectOption({ label: 'Verteporfin PDT — standard' });
    await page.waitForURL(/[?&]protocol=pdt-standard(&|$)/);
    await expect.poll(() => version.isDisabled()).toBe(false);
    expect(await version.locator('option').allInnerTexts()).toContain('Version 1');
    await expect
      .poll(async () => {
        const rows = await settledRows(page);
        return rows.length > 0 && rows.every((row) => row.includes('Verteporfin PDT — standard'));
      })
      .toBe(true);
    expect(await accessibilityViolations(page)).toEqual([]);

    expect(problems).toEqual([]);
    await context.close();
  });
});
