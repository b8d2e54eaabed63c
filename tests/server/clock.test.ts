import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestPerson, signedInAgent, startTestApp, type TestContext } from '../support/api';

// The server reads business time from the one clock handed to createApp, so a test that fixes
// that clock sees its time in every answer that states the server's time.
const fixedMs = Date.parse('2031-02-03T04:05:06.000Z');
let ctx: TestContext;

beforeAll(async () => {
  ctx = await startTestApp({}, { now: () => fixedMs });
});
afterAll(async () => {
  await ctx?.close();
});

describe("the server's clock", () => {
  it("is the one handed to the app: Today states its time, not the machine's", async () => {
    const nurse = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
    const today = await nurse.get('/api/today');
    expect(today.status, JSON.stringify(today.body)).toBe(200);
    expect(today.body.serverTime).toBe('2031-02-03T04:05:06.000Z');
  });

  it("dates an auditor's export by it", async () => {
    const auditor = await signedInAgent(ctx, await createTestPerson(ctx, ['auditor']));
    const csv = await auditor.get('/api/exports/deviations.csv');
    expect(csv.status).toBe(200);
    expect(csv.headers['content-disposition']).toBe(
      'attachment; filename="luxtempo-deviations-2031-02-03.csv"',
    );
  });
});
