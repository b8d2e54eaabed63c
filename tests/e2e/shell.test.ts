import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import {
  accessibilityViolations,
  signInThroughForm,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

let ctx: BrowserContext;
beforeAll(async () => {
  ctx = await startBrowserTest();
});
afterAll(async () => {
  await ctx?.close();
});

/** What each demo role should find in the main navigation — and nothing more. */
const expectedNavigation: Record<string, string[]> = {
  clinician: [
    'Today',
    'Orders',
    'Patients',
    'Protocols',
    'Light calculator',
    'Lists',
    'Devices',
    'Outcomes',
  ],
  nurse: ['Today', 'Orders', 'Patients', 'Protocols', 'Light calculator', 'Lists', 'Devices'],
  pharmacist: [
    'Today',
    'Dose checks',
    'Orders',
    'Patients',
    'Protocols',
    'Light calculator',
    'Lists',
    'Stock',
    'Recall',
    'Drug use',
    'Devices',
  ],
  auditor: [
    'Today',
    'Orders',
    'Patients',
    'Protocols',
    'Light calculator',
    'Deviations',
    'Dose records',
    'Trends',
    'Outcomes',
    'Audit trail',
    'Lists',
    'Stock',
    'Recall',
    'Drug use',
    'Devices',
  ],
  admin: [
    'Today',
    'Patients',
    'Protocols',
    'Light calculator',
    'Lists',
    'Devices',
    'People',
    'Cancel orders',
    'Outbox',
  ],
  'charge-nurse': [
    'Today',
    'Orders',
    'Patients',
    'Protocols',
    'Light calculator',
    'Lists',
    'Devices',
    'People',
    'Cancel orders',
    'Outbox',
  ],
};

async function navigationLabels(page: Page): Promise<string[]> {
  const nav = page.getByRole('navigation', { name: 'Main' });
  await nav.waitFor();
  return (await nav.getByRole('link').allInnerTexts()).map((t) => t.trim());
}

describe('signing in through the browser', () => {
  for (const [role, labels] of Object.entries(expectedNavigation)) {
    it(`the demo ${role} signs in and sees exactly their own navigation, with no console errors`, async () => {
      const page = await ctx.browser.newPage({ viewport: { width: 1024, height: 768 } });
      const problems = watchPage(page, ctx.baseUrl);
      await signInThroughForm(page, ctx.baseUrl, `${role}@demo.luxtempo.example`, demoPassword);
      expect((await navigationLabels(page)).sort()).toEqual([...labels].sort());
      expect(problems).toEqual([]);
      await page.close();
    });
  }

  it('a wrong password shows the error on the page and no session', async () => {
    const page = await ctx.browser.newPage();
    await signInThroughForm(page, ctx.baseUrl, 'nurse@demo.luxtempo.example', 'not-the-password');
    await expect
      .poll(() => page.getByRole('alert').innerText())
      .toMatch(/e-mail or password is not right/);
    expect(page.url()).toContain('/sign-in');
    await page.close();
  });

  it('empty fields get an error beside each field, without a request', async () => {
    const page = await ctx.browser.newPage();
    await page.goto(`${ctx.baseUrl}/sign-in`);
    await page.getByRole('button', { name: 'Sign in' }).click();
    const email = page.getByLabel('E-mail');
    await expect.poll(() => email.getAttribute('aria-invalid')).toBe('true');
    const describedBy = await email.getAttribute('aria-describedby');
    expect(describedBy).toBeTruthy();
    expect(await page.locator(`[id="${describedBy!.split(' ')[0]}"]`).innerText()).toMatch(
      /e-mail/i,
    );
    await page.close();
  });

  it('signing out returns to the sign-in page, and pages then ask for sign-in', async () => {
    const page = await ctx.browser.newPage();
    await signInThroughForm(page, ctx.baseUrl, 'admin@demo.luxtempo.example', demoPassword);
    await navigationLabels(page);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    await page.goto(`${ctx.baseUrl}/people`);
    await page.waitForURL(/\/sign-in\?redirectTo=%2Fpeople/);
    await page.close();
  });

  it('an unknown address shows the not-found page', async () => {
    const page = await ctx.browser.newPage();
    await signInThroughForm(page, ctx.baseUrl, 'nurse@demo.luxtempo.example', demoPassword);
    await navigationLabels(page);
    await page.goto(`${ctx.baseUrl}/no/such/page`);
    await expect
      .poll(() => page.getByRole('heading', { level: 1 }).innerText())
      .toBe('There is no page here');
    await page.close();
  });
});

describe('the look of the app', () => {
  it('uses the shipped Lexend font, loaded from this server only', async () => {
    const page = await ctx.browser.newPage();
    const problems = watchPage(page, ctx.baseUrl);
    await page.goto(`${ctx.baseUrl}/sign-in`);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    // document.fonts.check() answers true even for missing fonts; the FontFace list does not lie.
    const faces = await page.evaluate(async () => {
      await document.fonts.ready;
      return [...document.fonts]
        .filter((f) => f.status === 'loaded')
        .map((f) => f.family.replace(/["']/g, ''));
    });
    expect(faces).toContain('Lexend');
    const family = await page
      .getByRole('button', { name: 'Sign in' })
      .evaluate((el) => getComputedStyle(el).fontFamily);
    expect(family).toMatch(/^"?Lexend/);
    expect(problems).toEqual([]);
    await page.close();
  });

  it('has no WCAG A/AA violations on the sign-in page, Today and People', async () => {
    const page = await ctx.browser.newPage({ viewport: { width: 1024, height: 768 } });
    await page.goto(`${ctx.baseUrl}/sign-in`);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(await accessibilityViolations(page)).toEqual([]);
    await signInThroughForm(page, ctx.baseUrl, 'admin@demo.luxtempo.example', demoPassword);
    await navigationLabels(page);
    expect(await accessibilityViolations(page)).toEqual([]);
    await page.getByRole('link', { name: 'People' }).click();
    await page.getByRole('table').waitFor();
    expect(await accessibilityViolations(page)).toEqual([]);
    await page.close();
  });

  it('shows a focus ring when moving through the sign-in form with the keyboard', async () => {
    const page = await ctx.browser.newPage();
    await page.goto(`${ctx.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').waitFor();
    await page.keyboard.press('Tab');
    let guard = 0;
    while (
      !(await page.evaluate(
        () =>
          document.activeElement?.id &&
          document.activeElement ===
            document.querySelector('input[type="email"], input[name="email"]'),
      )) &&
      guard++ < 6
    ) {
      await page.keyboard.press('Tab');
    }
    const outline = await page.evaluate(() => {
      const style = getComputedStyle(document.activeElement as Element);
      return { outline: style.outlineStyle, width: style.outlineWidth, shadow: style.boxShadow };
    });
    expect(
      outline.outline !== 'none' && outline.width !== '0px' ? true : outline.shadow !== 'none',
    ).toBe(true);
    await page.close();
  });
});
