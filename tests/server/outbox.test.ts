import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSmtpMailer } from '../../server/mail/mailer';
import { systemClock } from '../../server/clock';
import { asTransaction } from '../../server/db/unit-of-work';
import { createOutboxWorker, retryDelayS } from '../../server/mail/outbox';
import { createOutboxRepository, enqueueMessage } from '../../server/mail/outbox-repository';
import { ensureMailCatcher, type MailCatcher } from '../../server/ops/mail-catcher';
import { startTestApp, testConfig, type TestContext } from '../support/api';

// Ports of this test's own, so it never touches the catcher that `npm start` runs.
const smtpPort = 1127;
const webPort = 1182;

let ctx: TestContext;
let catcher: MailCatcher | undefined;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(async () => {
  catcher?.stop();
  await ctx.close();
});

describe('the outbox', () => {
  it('keeps a message while the mail server is down, retries with growing waits, and delivers it once the server is back', async () => {
    const subject = `Luxtempo test message ${randomUUID()}`;
    await enqueueMessage(asTransaction(ctx.dataSource.manager), {
      kind: 'test',
      recipients: ['ward@test.luxtempo.example'],
      subject,
      body: 'Hello from the outbox test.',
    });
    const mailer = createSmtpMailer(testConfig({ SMTP_PORT: String(smtpPort) }));
    // Other tests leave messages waiting too; one batch large enough takes them all in.
    const worker = createOutboxWorker(createOutboxRepository(ctx.dataSource), mailer, systemClock, {
      batchSize: 5000,
    });

    await worker.runOnce();
    const [waiting] = await ctx.dataSource.query(
      'SELECT status, attempts, last_error, next_attempt_at FROM outbox_message WHERE subject = ?',
      [subject],
    );
    expect(waiting.status).toBe('pending');
    expect(waiting.attempts).toBe(1);
    expect(waiting.last_error).toMatch(/ECONNREFUSED|connect/i);
    expect(new Date(waiting.next_attempt_at).getTime()).toBeGreaterThan(Date.now());

    catcher = await ensureMailCatcher(smtpPort, webPort);
    // Skip the back-off wait rather than sleeping through it.
    await ctx.dataSource.query(
      'UPDATE outbox_message SET next_attempt_at = NOW(3) WHERE subject = ?',
      [subject],
    );
    await worker.runOnce();
    const [sent] = await ctx.dataSource.query(
      'SELECT status, attempts, sent_at FROM outbox_message WHERE subject = ?',
      [subject],
    );
    expect(sent).toMatchObject({ status: 'sent', attempts: 2 });

    const inbox = (await (await fetch(`http://127.0.0.1:${webPort}/api/email`)).json()) as {
      subject: string;
      to: { address: string }[];
    }[];
    const delivered = inbox.filter((m) => m.subject === subject);
    expect(delivered).toHaveLength(1);
    expect(delivered[0]!.to[0]!.address).toBe('ward@test.luxtempo.example');

    // A second pass sends nothing again.
    await worker.runOnce();
    const again = (await (await fetch(`http://127.0.0.1:${webPort}/api/email`)).json()) as {
      subject: string;
    }[];
    expect(again.filter((m) => m.subject === subject)).toHaveLength(1);
    mailer.close();
  });

  it('waits 5 s after the first failure, doubling up to 15 minutes', () => {
    expect([1, 2, 3, 4].map(retryDelayS)).toEqual([5, 10, 20, 40]);
    expect(retryDelayS(30)).toBe(900);
  });

  it('lets an admin see the outbox, and nobody else', async () => {
    const { createTestPerson, signedInAgent } = await import('../support/api');
    const admin = await signedInAgent(ctx, await createTestPerson(ctx, ['admin']));
    const nurse = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
    const res = await admin.get('/api/outbox');
    expect(res.status).toBe(200);
    expect(Array.isArray(res.body.messages)).toBe(true);
    expect((await nurse.get('/api/outbox')).status).toBe(403);
  });
});
