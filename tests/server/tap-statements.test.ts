import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createTestPatient,
  createTestPerson,
  cxlOrder,
  signOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
} from '../support/api';
import { readyBench } from '../support/devices';

// What a tap costs the database, counted rather than timed (the benchmark times it: README,
// Performance): every statement the app sends for one ordinary tap in a running session.
let ctx: TestContext;
let bench: Awaited<ReturnType<typeof readyBench>>;
beforeAll(async () => {
  ctx = await startTestApp();
  bench = await readyBench(await signedInAgent(ctx, await createTestPerson(ctx, ['admin'])));
});
afterAll(async () => {
  await ctx.close();
});

/** Runs `work` and returns the statements the app sent meanwhile, whitespace folded. */
async function statementsDuring(work: () => Promise<void>): Promise<string[]> {
  const seen: string[] = [];
  const logger = ctx.dataSource.logger;
  const original = logger.logQuery;
  logger.logQuery = (query, parameters, runner) => {
    seen.push(query.replace(/\s+/g, ' ').trim());
    return original.call(logger, query, parameters, runner);
  };
  try {
    await work();
  } finally {
    logger.logQuery = original;
  }
  return seen;
}

const checks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
};

describe('statements per tap', () => {
  it('an ordinary tap in a running session is six statements, one transaction', async () => {
    const clinician = await createTestPerson(ctx, ['clinician']);
    const clinicianAgent = await signedInAgent(ctx, clinician);
    const nurseAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
    const patient = await createTestPatient(ctx);
    const order = await signOrder(clinicianAgent, clinician, cxlOrder(patient.id));
    const t0 = Date.now() - 60_000;
    const post = (seconds: number, event: object) =>
      nurseAgent.post(`/api/orders/${order.id}/session-events`).send({
        idempotencyKey: randomUUID(),
        clientTime: new Date(t0 + seconds * 1000).toISOString(),
        ...event,
      });
    expect(
      (await post(0, { type: 'session-started', checks, device: bench.deviceFor(order) })).status,
    ).toBe(201);
    expect((await post(1, { type: 'step-started', stepId: 'riboflavin-soak' })).status).toBe(201);
    expect((await post(2, { type: 'drop-given', stepId: 'riboflavin-soak' })).status).toBe(201);

    let status = 0;
    const statements = await statementsDuring(async () => {
      status = (await post(3, { type: 'drop-given', stepId: 'riboflavin-soak' })).status;
    });
    expect(status).toBe(201);
    // Eight before (the person's row; begin; the order locked; the event inserted; new events
    // read; deviations read; the record saved; commit). The lock's statement now also reads the
    // newest event id and the deviations, and this process knows the session's earlier events.
    expect(statements, statements.join('\n')).toHaveLength(6);
    expect(statements.filter((q) => q.startsWith('SELECT'))).toHaveLength(2);
    expect(statements.filter((q) => q === 'START TRANSACTION')).toHaveLength(1);
    expect(statements.filter((q) => q === 'COMMIT')).toHaveLength(1);
    expect(statements.filter((q) => /FOR UPDATE/.test(q))).toHaveLength(1);
    // A signed order's plan and checklist cannot change (the database refuses it), so after the
    // session's first tap the lock no longer reads them; the signature time is still read.
    const lock = statements.find((q) => /FOR UPDATE/.test(q))!;
    expect(lock).toContain('NULL AS plan');
    expect(lock).toContain('o.signed_at');
  });

  it('two API processes taking turns on one session each count every event; the one that did not write the previous tap reads what it lacks', async () => {
    // A second app on the same database: its own repositories, so its own memory of sessions.
    const other = await startTestApp();
    try {
      const clinician = await createTestPerson(ctx, ['clinician']);
      const clinicianAgent = await signedInAgent(ctx, clinician);
      const nurse = await createTestPerson(ctx, ['nurse']);
      const here = await signedInAgent(ctx, nurse);
      const there = await signedInAgent(other, nurse);
      const patient = await createTestPatient(ctx);
      const order = await signOrder(clinicianAgent, clinician, cxlOrder(patient.id));
      const t0 = Date.now() - 60_000;
      const post = (agent: typeof here, seconds: number, event: object) =>
        agent.post(`/api/orders/${order.id}/session-events`).send({
          idempotencyKey: randomUUID(),
          clientTime: new Date(t0 + seconds * 1000).toISOString(),
          ...event,
        });
      const drop = { type: 'drop-given', stepId: 'riboflavin-soak' };
      expect(
        (await post(here, 0, { type: 'session-started', checks, device: bench.deviceFor(order) }))
          .body.eventCount,
      ).toBe(1);
      expect(
        (await post(there, 1, { type: 'step-started', stepId: 'riboflavin-soak' })).body.eventCount,
      ).toBe(2);
      let sent = 2;
      for (let i = 0; i < 3; i++) {
        let res = await post(here, 2 + 2 * i, drop);
        expect(res.status).toBe(201);
        expect(res.body.eventCount).toBe(++sent);
        res = await post(there, 3 + 2 * i, drop);
        expect(res.status).toBe(201);
        expect(res.body.eventCount).toBe(++sent);
      }
      let answer: { eventCount: number; record: { drops: { at: string }[] } } | null = null;
      const afterOther = await statementsDuring(async () => {
        answer = (await post(here, 20, drop)).body;
      });
      expect(answer!.eventCount).toBe(++sent);
      // The lock, then a read of the events the other process stored: seven. (Returning them
      // with the lock's statement, as a second JSON_ARRAYAGG, cost MariaDB more on every tap
      // than this read costs on some: README, "Statements per tap".)
      expect(afterOther, afterOther.join('\n')).toHaveLength(7);
      // The record this process derived counts the other process's drops too, at their times.
      expect(answer!.record.drops.map((d) => d.at)).toEqual(
        [2, 3, 4, 5, 6, 7, 20].map((s) => new Date(t0 + s * 1000).toISOString()),
      );
      const state = await here.get(`/api/orders/${order.id}/session`);
      expect(state.body.events).toHaveLength(sent);
      expect(
        state.body.events.filter((e: { type: string }) => e.type === 'drop-given'),
      ).toHaveLength(7);
    } finally {
      await other.close();
    }
  });

  it('taps sent at once through two API processes queue on the order lock, and each sees every tap committed before it', async () => {
    const other = await startTestApp();
    try {
      const clinician = await createTestPerson(ctx, ['clinician']);
      const clinicianAgent = await signedInAgent(ctx, clinician);
      const nurse = await createTestPerson(ctx, ['nurse']);
      const agents = [await signedInAgent(ctx, nurse), await signedInAgent(other, nurse)];
      const patient = await createTestPatient(ctx);
      const order = await signOrder(clinicianAgent, clinician, cxlOrder(patient.id));
      const at = new Date(Date.now() - 60_000).toISOString();
      const post = (agent: (typeof agents)[number], event: object) =>
        agent
          .post(`/api/orders/${order.id}/session-events`)
          .send({ idempotencyKey: randomUUID(), clientTime: at, ...event });
      expect(
        (
          await post(agents[0]!, {
            type: 'session-started',
            checks,
            device: bench.deviceFor(order),
          })
        ).status,
      ).toBe(201);
      expect(
        (await post(agents[1]!, { type: 'step-started', stepId: 'riboflavin-soak' })).status,
      ).toBe(201);
      // Both processes have the session in memory; then ten drops at once, alternating.
      const answers = await Promise.all(
        Array.from({ length: 10 }, (_, i) =>
          post(agents[i % 2]!, { type: 'drop-given', stepId: 'riboflavin-soak' }),
        ),
      );
      expect(answers.map((a) => a.status)).toEqual(Array(10).fill(201));
      // One at a time under the lock: the answers count 3, 4, … 12 events, each once. A tap that
      // missed one committed before it would count too few and repeat a number.
      expect(answers.map((a) => a.body.eventCount).sort((a, b) => a - b)).toEqual(
        Array.from({ length: 10 }, (_, i) => i + 3),
      );
      const state = await agents[0]!.get(`/api/orders/${order.id}/session`);
      expect(state.body.events).toHaveLength(12);
    } finally {
      await other.close();
    }
  });
});
