import type { Clock } from '../clock';
import type { Mailer } from './mailer';
import type { OutboxRepository } from './outbox-repository';

/** Seconds before attempt n+1: 5, 10, 20, … up to 15 minutes. The outbox never gives up on a dead server. */
export function retryDelayS(attempts: number): number {
  return Math.min(5 * 2 ** Math.max(0, attempts - 1), 15 * 60);
}

const leaseS = 120;

/** Messages that carry a secret (a one-time link): once delivered, their text is not kept. */
const secretKinds = new Set(['password-link']);

/**
 * Sends due messages. Each batch is claimed by pushing its next attempt a lease into the future
 * (under SKIP LOCKED), so several app instances can run workers on one database without sending
 * a message twice, and a worker that dies mid-send only delays its batch by the lease.
 */
export function createOutboxWorker(
  outbox: OutboxRepository,
  mailer: Mailer,
  clock: Clock,
  options: { intervalMs?: number; batchSize?: number } = {},
) {
  async function runOnce(): Promise<number> {
    const batch = await outbox.claimDue(options.batchSize ?? 20, leaseS);
    let sent = 0;
    for (const message of batch) {
      const attempts = message.attempts + 1;
      try {
        await mailer.send({ to: message.recipients, subject: message.subject, text: message.body });
        await outbox.update(message.id, {
          status: 'sent',
          attempts,
          sentAt: clock.now(),
          lastError: null,
          ...(secretKinds.has(message.kind)
            ? { body: '(removed once delivered: it held a one-time link)' }
            : {}),
        });
        sent++;
      } catch (error) {
        const responseCode = (error as { responseCode?: number }).responseCode;
        // A 5xx answer means the server refused this message for good; anything else is retried.
        const permanent =
          typeof responseCode === 'number' && responseCode >= 500 && responseCode < 600;
        await outbox.update(message.id, {
          status: permanent ? 'failed' : 'pending',
          attempts,
          lastError: String((error as Error).message ?? error).slice(0, 500),
          nextAttemptAt: new Date(clock.now().getTime() + retryDelayS(attempts) * 1000),
        });
      }
    }
    return sent;
  }

  return pollingWorker(runOnce, 'Outbox worker', options.intervalMs ?? 2000);
}

/**
 * Runs `pass` now and then every `intervalMs` after the previous pass ended; one pass at a time
 * (a `runOnce` during a pass joins it), and `stop` waits for the pass under way.
 */
export function pollingWorker(pass: () => Promise<number>, label: string, intervalMs: number) {
  let timer: NodeJS.Timeout | undefined;
  let running: Promise<number> | undefined;
  const runOnce = () => {
    running ??= pass().finally(() => (running = undefined));
    return running;
  };
  return {
    /** One pass over what is due; returns how many were sent. */
    runOnce,
    start() {
      const tick = () => {
        void runOnce()
          .catch((error) => console.error(`${label}:`, (error as Error).message))
          .finally(() => {
            if (timer) timer = setTimeout(tick, intervalMs);
          });
      };
      timer = setTimeout(tick, 0);
    },
    async stop() {
      const t = timer;
      timer = undefined;
      if (t) clearTimeout(t);
      await running;
    },
  };
}

export type OutboxWorker = ReturnType<typeof createOutboxWorker>;
