import { randomUUID } from 'node:crypto';
import type mysql from 'mysql2/promise';
import { demoPassword } from '../../server/demo/seed';
import { nodeConnection, type GaleraNodeSpec } from '../../server/ops/galera';
import { FaultClient, readyUvSource } from './fault-rig';

/** The checks a nurse confirms before a session starts. */
export const allChecks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
};

export interface Tap {
  idempotencyKey: string;
  clientTime: string;
  type: string;
  [field: string]: unknown;
}

/**
 * A bedside tablet as the step clock behaves: each tap is queued, then sent in order with its
 * idempotency key, and sent again after a network failure or a 5xx/408/429 until the server
 * answers 201 (stored) or 200 (stored before). Anything else is a failure of the test.
 */
export class Tablet {
  readonly made: Tap[] = [];
  readonly answers: { status: number; at: number }[] = [];
  private queue: Tap[] = [];
  private sending: Promise<void> | null = null;
  private t0 = Date.now() - 30 * 60_000;
  private nextS = 180;
  refused: string[] = [];
  /** Answers whose event count was not the number of this order's taps stored so far. */
  readonly miscounted: string[] = [];
  private stored = 0;

  constructor(
    readonly nurse: FaultClient,
    readonly orderId: number,
    /** The checked UV source and its setting, which the session start names. */
    readonly device: Record<string, unknown>,
  ) {}

  private tap(fields: Record<string, unknown>): Tap {
    return {
      idempotencyKey: randomUUID(),
      clientTime: new Date(this.t0 + this.nextS++ * 1000).toISOString(),
      type: 'drop-given',
      ...fields,
    };
  }

  /** Starts the session and the soak: the drops that follow belong to it. */
  async begin(): Promise<void> {
    this.nextS = 0;
    this.add(this.tap({ type: 'session-started', checks: allChecks, device: this.device }));
    this.nextS = 60;
    this.add(this.tap({ type: 'step-started', stepId: 'riboflavin-soak' }));
    this.nextS = 180;
    await this.drained(30_000);
  }

  /** One more drop tapped on the screen. */
  drop(): Tap {
    const tap = this.tap({ type: 'drop-given', stepId: 'riboflavin-soak' });
    this.add(tap);
    return tap;
  }

  private add(tap: Tap) {
    this.made.push(tap);
    this.queue.push(tap);
    this.sending ??= this.sendAll().finally(() => (this.sending = null));
  }

  get unsent(): number {
    return this.queue.length;
  }

  private async sendAll(): Promise<void> {
    let waitMs = 100;
    while (this.queue.length) {
      const tap = this.queue[0]!;
      let status: number;
      try {
        status = (await this.nurse.call('POST', `/orders/${this.orderId}/session-events`, tap))
          .status;
      } catch {
        status = 0; // the network failed: no answer at all
      }
      this.answers.push({ status, at: Date.now() });
      if (status === 201 || status === 200) {
        this.queue.shift();
        waitMs = 100;
      } else if (status === 0 || status >= 500 || status === 408 || status === 429) {
        await new Promise((r) => setTimeout(r, waitMs));
        waitMs = Math.min(waitMs * 2, 1_000);
      } else {
        this.refused.push(`${tap.idempotencyKey}: ${status}`);
        this.queue.shift();
      }
    }
  }

  /** Resolves when every tap made so far is stored. */
  async drained(timeoutMs: number): Promise<void> {
    const until = Date.now() + timeoutMs;
    while (this.queue.length) {
      if (Date.now() > until)
        throw new Error(`order ${this.orderId}: ${this.queue.length} taps still unsent`);
      await (this.sending ?? Promise.resolve());
    }
  }
}

/** Tablets tapping a drop every `everyMs` until stopped; the taps go on during a fault. */
export function keepTapping(tablets: Tablet[], everyMs: number) {
  const timer = setInterval(() => {
    for (const tablet of tablets) tablet.drop();
  }, everyMs);
  return {
    async stop(timeoutMs = 60_000) {
      clearInterval(timer);
      await Promise.all(tablets.map((t) => t.drained(timeoutMs)));
    },
  };
}

/** A nurse signed in through HAProxy, and a tablet for each new ready order. */
export async function tabletsFor(
  url: string,
  readyOrder: (base: string) => Promise<number>,
  count: number,
): Promise<Tablet[]> {
  const nurse = await new FaultClient(url).signIn('nurse@demo.luxtempo.example', demoPassword);
  const device = await readyUvSource(url);
  const tablets: Tablet[] = [];
  for (let i = 0; i < count; i++) {
    const tablet = new Tablet(nurse, await readyOrder(url), device);
    await tablet.begin();
    tablets.push(tablet);
  }
  return tablets;
}

/** Reads a node as its administrator, after everything committed anywhere has reached it. */
export async function onNode<T>(
  node: GaleraNodeSpec,
  read: (db: mysql.Connection) => Promise<T>,
): Promise<T> {
  const db = await nodeConnection(node);
  try {
    await db.query('SET SESSION wsrep_sync_wait = 1');
    return await read(db);
  } finally {
    await db.end();
  }
}

/** The idempotency keys stored for an order on one node, as they are (duplicates would show). */
export async function storedKeys(
  node: GaleraNodeSpec,
  database: string,
  orderId: number,
): Promise<string[]> {
  return onNode(node, async (db) => {
    const [rows] = await db.query(
      `SELECT idempotency_key AS k FROM \`${database}\`.session_event WHERE order_id = ? ORDER BY k`,
      [orderId],
    );
    return (rows as { k: string }[]).map((r) => r.k);
  });
}

export async function waitFor(
  what: string,
  check: () => Promise<boolean> | boolean,
  timeoutMs = 30_000,
): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > until) throw new Error(`waited ${timeoutMs / 1000} s for ${what}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}
