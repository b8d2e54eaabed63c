import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { chromium, type Browser, type Page } from 'playwright-core';
import { seedDemoData } from '../../server/demo/seed';
import { startWebServer, stopWebServer, type RunningWebServer } from '../../server/index';
import { clientDistDir } from '../../server/ops/paths';
import { browserTestDatabase } from '../../server/ops/test-environment';
import { testConfig } from './api';

export interface BrowserContext {
  baseUrl: string;
  /** The server's clock: real time plus `serverClock.offsetMs`, which a test moves with the page's clock. */
  serverClock: { offsetMs: number };
  browser: Browser;
  server: RunningWebServer;
  close(): Promise<void>;
}

/** The built client and the API on a free loopback port, with the demo people, and Debian's Chromium. */
export async function startBrowserTest(
  overrides: Record<string, string> = {},
): Promise<BrowserContext> {
  const serverClock = { offsetMs: 0 };
  const config = testConfig({ DB_NAME: browserTestDatabase(process.env.DB_NAME!), ...overrides });
  const server = await startWebServer({
    config,
    clientDir: clientDistDir,
    port: 0,
    clock: { now: () => new Date(Date.now() + serverClock.offsetMs) },
  });
  await seedDemoData(server.dataSource);
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
    ],
  });
  return {
    baseUrl: server.url,
    serverClock,
    browser,
    server,
    async close() {
      await browser.close();
      await stopWebServer(server);
    },
  };
}

/** Console errors, page errors and requests that leave the machine, gathered per page. */
export function watchPage(page: Page, baseUrl: string) {
  const problems: string[] = [];
  page.on('console', (m) => {
    // A failed load names no address in its text; the location says which resource it was.
    if (m.type() === 'error')
      problems.push(
        `console: ${m.text()}${m.text().startsWith('Failed to load resource') ? ` (${m.location().url})` : ''}`,
      );
  });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('request', (r) => {
    const url = r.url();
    if (!url.startsWith(baseUrl) && !url.startsWith('data:') && !url.startsWith('blob:'))
      problems.push(`left the machine: ${url}`);
  });
  return problems;
}

/**
 * The rows of the page's first table once it has settled: none while the table's wrapper says
 * aria-busy (a new page or order still loading behind the one shown).
 */
export async function settledRows(page: Page): Promise<string[]> {
  const table = page.locator('main table').first();
  if (
    (await table.count()) === 0 ||
    (await table.locator('xpath=..').getAttribute('aria-busy')) === 'true'
  )
    return [];
  return table.locator('tbody tr').allInnerTexts();
}

export async function signInThroughForm(
  page: Page,
  baseUrl: string,
  email: string,
  password: string,
) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

/** Runs axe-core in the page; returns violations of WCAG 2 A/AA rules. */
export async function accessibilityViolations(page: Page) {
  // Evaluated through the DevTools protocol, so the app's strict CSP needs no loosening for it.
  await page.evaluate(axeSource);
  return page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: {
          run: (
            ctx: Document,
            opts: object,
          ) => Promise<{
            violations: {
              id: string;
              help: string;
              impact: string | null;
              nodes: { target: string[] }[];
            }[];
          }>;
        };
      }
    ).axe;
    const result = await axe.run(document, {
      runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] },
    });
    return result.violations.map((v) => ({
      id: v.id,
      help: v.help,
      impact: v.impact,
      targets: v.nodes.map((n) => n.target.join(' ')),
    }));
  });
}
