import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import {
  accessibilityViolations,
  signInThroughForm,
  startBrowserTest,
  type BrowserContext,
} from '../support/browser';

let ctx: BrowserContext;
beforeAll(async () => {
  ctx = await startBrowserTest();
});
afterAll(async () => {
  await ctx?.close();
});

describe('the audit chain check on screen', () => {
  for (const [role, screen, ready] of [
    ['admin', '/people', 'table'],
    ['auditor', '/audit-trail', 'table'],
  ] as const) {
    it(`the ${role} runs it from ${screen} and reads that the chain is intact, with no accessibility violations`, async () => {
      const page = await ctx.browser.newPage({ viewport: { width: 1024, height: 768 } });
      await signInThroughForm(page, ctx.baseUrl, `${role}@demo.luxtempo.example`, demoPassword);
      await page.goto(`${ctx.baseUrl}${screen}`);
      await page.getByRole(ready).first().waitFor();
      const panel = page.getByRole('region', { name: 'Is the audit trail intact?' });
      await panel.getByRole('button', { name: 'Check the chain now' }).click();
      await panel.getByText('Intact', { exact: true }).waitFor();
      expect(await panel.innerText()).toMatch(/All [\d,]+ events match their hashes/);
      expect(await accessibilityViolations(page)).toEqual([]);
      await page.close();
    });
  }
});
