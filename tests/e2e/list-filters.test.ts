import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import {
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

/*
 * Every list that keeps its filters in the address, changed twice in one go: both changes are
 * made in the same task, before the screen can re-render with the first (as a browser's autofill
 * or a script can, and a quick person nearly can). Each change has to build on the address as it
 * stands at that moment, or the second one silently drops the first.
 */

let ctx: BrowserContext;
beforeAll(async () => {
  ctx = await startBrowserTest();
});
afterAll(async () => {
  await ctx?.close();
});

/** One filter control: its label, the value chosen, and that value's name and form in the address and in the API request. */
/** `value` is what is typed (dates in the unit's day/month/year); `inUrl` what the address then holds. */
type FilterChange = {
  label: string;
  value: string;
  param: string;
  inUrl?: string;
  inRequest?: string;
};

type ListUnderTest = {
  screen: string;
  path: string;
  form: string;
  api: string;
  first: FilterChange;
  second: FilterChange;
};

const lists: ListUnderTest[] = [
  {
    screen: 'orders',
    path: '/orders',
    form: 'Filter the orders',
    api: '/api/orders',
    first: { label: 'Status', value: 'signed', param: 'status' },
    second: { label: 'Created from', value: '15/01/2024', param: 'from', inUrl: '2024-01-15' },
  },
  {
    screen: 'deviations',
    path: '/deviations',
    form: 'Filter the deviations',
    api: '/api/deviations',
    first: { label: 'Severity', value: 'major', param: 'severity' },
    second: { label: 'Detected from', value: '01/02/2024', param: 'from', inUrl: '2024-02-01' },
  },
  {
    screen: 'dose records',
    path: '/dose-records',
    form: 'Filter the dose records',
    api: '/api/dose-records',
    first: { label: 'Outcome', value: 'stopped', param: 'outcome' },
    second: { label: 'Ended to', value: '31/03/2024', param: 'to', inUrl: '2024-03-31' },
  },
  {
    screen: 'audit trail',
    path: '/audit-trail',
    form: 'Filter the audit trail',
    api: '/api/audit-events',
    first: { label: 'From', value: '01/04/2024', param: 'from', inUrl: '2024-04-01' },
    second: { label: 'Order of events', value: 'asc', param: 'direction' },
  },
  {
    screen: 'trends',
    path: '/trends',
    form: 'Choose the months and protocol',
    api: '/api/trends',
    first: { label: 'First month', value: '2024-01', param: 'from', inRequest: '2024-01-01' },
    second: { label: 'Last month', value: '2024-06', param: 'to', inRequest: '2024-06-01' },
  },
];

/**
 * Sets both controls and fires their events from one script run, so no render, timer or network
 * reply can come between them. The value is set through the prototype's setter because React
 * ignores an input event whose value it has already seen set on the element.
 */
async function changeBothAtOnce(
  page: Page,
  form: string,
  first: FilterChange,
  second: FilterChange,
) {
  const filters = page.getByRole('form', { name: form });
  const controls = [
    [await filters.getByLabel(first.label, { exact: true }).elementHandle(), first.value],
    [await filters.getByLabel(second.label, { exact: true }).elementHandle(), second.value],
  ] as const;
  await page.evaluate((pairs) => {
    for (const [control, value] of pairs) {
      const isSelect = control instanceof HTMLSelectElement;
      Object.getOwnPropertyDescriptor(
        isSelect ? HTMLSelectElement.prototype : HTMLInputElement.prototype,
        'value',
      )?.set?.call(control, value);
      control.dispatchEvent(new Event(isSelect ? 'change' : 'input', { bubbles: true }));
    }
  }, controls);
}

describe('two filter changes made at once are both kept', () => {
  for (const list of lists) {
    it(`on the ${list.screen}: the address and the list's request carry both`, async () => {
      const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
      const page = await context.newPage();
      const problems = watchPage(page, ctx.baseUrl);
      const listRequests: URLSearchParams[] = [];
      page.on('request', (request) => {
        const url = new URL(request.url());
        if (url.pathname === list.api) listRequests.push(url.searchParams);
      });
      await signInThroughForm(page, ctx.baseUrl, 'auditor@demo.luxtempo.example', demoPassword);
      await page.getByRole('navigation', { name: 'Main' }).waitFor();
      await page.goto(`${ctx.baseUrl}${list.path}`);
      await page.getByRole('form', { name: list.form }).waitFor();
      await expect.poll(() => listRequests.length).toBeGreaterThan(0);

      await changeBothAtOnce(page, list.form, list.first, list.second);

      const wanted = {
        [list.first.param]: list.first.inUrl ?? list.first.value,
        [list.second.param]: list.second.inUrl ?? list.second.value,
      };
      await expect
        .poll(() => Object.fromEntries(new URL(page.url()).searchParams))
        .toMatchObject(wanted);
      const filters = page.getByRole('form', { name: list.form });
      await expect
        .poll(() => filters.getByLabel(list.first.label, { exact: true }).inputValue())
        .toBe(list.first.value);
      await expect
        .poll(() => filters.getByLabel(list.second.label, { exact: true }).inputValue())
        .toBe(list.second.value);
      const sent = (change: FilterChange) => change.inRequest ?? change.inUrl ?? change.value;
      await expect
        .poll(() =>
          listRequests.some(
            (search) =>
              search.get(list.first.param) === sent(list.first) &&
              search.get(list.second.param) === sent(list.second),
          ),
        )
        .toBe(true);

      expect(problems).toEqual([]);
      await context.close();
    });
  }
});
