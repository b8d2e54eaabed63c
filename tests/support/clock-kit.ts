import { randomUUID } from 'node:crypto';
import { request, type APIRequestContext, type Page } from 'playwright-core';
import { expect } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
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
    const opened = await signedInPage('nurse@demo.luxtempo.example', `/sessions/${orderId}`);
    await opened.page.locator('h1', { hasText: 'Step clock' }).waitFor();
    return opened;
  }

  /** Taps made earlier on another tablet, placed on the server's timeline `secondsAgo` before now. */
  async function seedEvents(
    orderId: number,
    taps: [secondsAgo: number, body: Record<string, unknown>][],
  ) {
    const nowMs = serverNowMs();
    for (const [secondsAgo, body] of taps) {
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

  return {
    serverNowMs,
    advance,
    signedInApi,
    signedInPage,
    nursePage,
    seedEvents,
    sessionOf,
    allStored,
  };
}

/** The five pre-treatment checks, all confirmed. */
export const allChecks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
};
