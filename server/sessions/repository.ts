import { DateTime } from 'luxon';
import type { DataSource, EntityManager } from 'typeorm';
import type { DoseRecord } from '../../shared/session/dose-record';
import type {
  Deviation,
  SessionEvent,
  SessionEventInput,
} from '../../shared/session/session-events';
import { DeviationRow } from '../db/entities/deviation';
import { DoseRecordRow } from '../db/entities/dose-record';
import type { SessionParticipant } from '../db/entities/session-participant';
import { quickQuery } from '../db/quick-query';
import { managerOf, type Transaction } from '../db/unit-of-work';

export interface StandingDeviation {
  id: number;
  type: string;
  severity: Deviation['severity'];
  expected: number | null;
  actual: number | null;
  unit: string | null;
  message: string;
  detectedAt: string;
}

/** Records that a person took part in a treatment; harmless when said twice. */
export function addParticipant(
  tx: Transaction,
  orderId: number,
  userId: number,
  part: SessionParticipant['part'],
) {
  return managerOf(tx).query(
    'INSERT IGNORE INTO session_participant (order_id, user_id, part) VALUES (?, ?, ?)',
    [orderId, userId, part],
  );
}

type StoredEventRow = {
  id: string | number;
  payload: string | Record<string, unknown>;
  serverTime: Date;
  recordedBy: number;
};

function toSessionEvent(row: StoredEventRow): SessionEvent {
  return {
    ...((typeof row.payload === 'string'
      ? JSON.parse(row.payload)
      : row.payload) as SessionEventInput),
    id: Number(row.id),
    serverTime: row.serverTime.toISOString(),
    recordedBy: row.recordedBy,
  };
}

/** The order a session's events are shown and replayed in: by the tablet's time, then as stored. */
function byClientTime(a: SessionEvent, b: SessionEvent): number {
  return Date.parse(a.clientTime) - Date.parse(b.clientTime) || a.id - b.id;
}

/** What a dose record copies from its order (see the entity): fixed once the order is signed. */
export interface RecordOrderFacts {
  eye: 'right' | 'left';
  patientId: number;
  plannedDoseMg: number | null;
  plannedFluenceJPerCm2: number | null;
}

/** The order facts a record copies, from the order's row and its frozen plan. */
export function recordOrderFacts(order: {
  eye: 'right' | 'left';
  patientId: number;
  plan: { doseMg?: number | null; fluenceJPerCm2?: number | null };
}): RecordOrderFacts {
  return {
    eye: order.eye,
    patientId: order.patientId,
    plannedDoseMg: order.plan.doseMg ?? null,
    plannedFluenceJPerCm2: order.plan.fluenceJPerCm2 ?? null,
  };
}

/** A session's events as this process last read them, up to and including `lastId`. */
interface KnownEvents {
  events: SessionEvent[];
  lastId: number;
}

const knownEventsMax = 2_000;

/** Every stored event of an order in the order they happened (by the tablet's time, then as stored). */
export function readSessionEvents(tx: Transaction, orderId: number): Promise<SessionEvent[]> {
  return readEventsWith(managerOf(tx), orderId);
}

async function readEventsWith(manager: EntityManager, orderId: number): Promise<SessionEvent[]> {
  const rows: StoredEventRow[] = await manager.query(
    'SELECT id, payload, server_time AS serverTime, recorded_by AS recordedBy FROM session_event WHERE order_id = ? ORDER BY client_time, id',
    [orderId],
  );
  return rows.map(toSessionEvent);
}

/** A deviation as stored, what `reconcileDeviations` compares the newly found ones with. */
export type StoredDeviation = Pick<
  DeviationRow,
  'id' | 'type' | 'severity' | 'expected' | 'actual' | 'message' | 'detectedAt' | 'withdrawnAt'
>;

/** The deviations the order's lock read as JSON (`lockForSession`), as `reconcileDeviations` takes them. */
export function storedDeviationsFrom(json: string | unknown[] | null): StoredDeviation[] {
  const list = (typeof json === 'string' ? JSON.parse(json) : (json ?? [])) as {
    id: number;
    type: string;
    severity: StoredDeviation['severity'];
    expected: number | null;
    actual: number | null;
    message: string;
    detectedAt: string;
    withdrawnAt: string | null;
  }[];
  // JSON carries DATETIME(3) as "2026-12-03 09:05:00.250": stored in UTC (the driver's timezone 'Z').
  const utc = (text: string) => new Date(`${text.replace(' ', 'T')}Z`);
  return list.map((d) => ({
    ...d,
    id: Number(d.id),
    detectedAt: utc(d.detectedAt),
    withdrawnAt: d.withdrawnAt === null ? null : utc(d.withdrawnAt),
  }));
}

/** What this process knew of a session, with the events stored since (in id order) added. */
function withAdded(known: KnownEvents | undefined, added: SessionEvent[]): KnownEvents {
  if (added.length === 0 && known) return known;
  const events = [...(known?.events ?? []), ...added];
  // New taps nearly always come last; sort only when one arrived late.
  const from = Math.max(1, events.length - added.length);
  for (let i = from; i < events.length; i++) {
    if (byClientTime(events[i - 1]!, events[i]!) > 0) {
      events.sort(byClientTime);
      break;
    }
  }
  return {
    events,
    lastId: added.length > 0 ? added[added.length - 1]!.id : (known?.lastId ?? 0),
  };
}

export function createSessionRepository(dataSource: DataSource) {
  /**
   * Running sessions' events, kept between writes so that each new event reads only what is newer
   * than the last one seen. This is safe because the table is append-only (the app's database user
   * may only INSERT and SELECT it) and an order's events are written one at a time under the
   * order's lock, so ids only grow within an order: "everything after lastId" is exactly what is
   * missing, even when another API process wrote it.
   */
  const knownEvents = new Map<number, KnownEvents>();
  /** People already recorded as having nursed a session, so a tap does not insert it again. */
  const knownNurses = new Set<string>();

  return {
    /** Every event of an order in the order they happened. */
    eventsFor: (orderId: number, tx?: Transaction): Promise<SessionEvent[]> =>
      readEventsWith(managerOf(tx) ?? dataSource.manager, orderId),

    /**
     * Every event of an order, for a writer that holds the order's lock and has just stored
     * `inserted`: when this process already knew every event up to `lastIdAtLock` (the newest id
     * as read with the lock), that list plus the new one, with no statement; otherwise what it
     * knew plus whatever was stored since. Ids only grow within an order (its events are written
     * one at a time under its lock), so "the newest id is the one I know" means nothing is
     * missing, even when another API process wrote before. Hand the result to `rememberEvents`
     * once the transaction has committed (never before: a rolled-back event must not be
     * remembered).
     */
    async eventsAfterInsert(
      tx: Transaction,
      orderId: number,
      lastIdAtLock: number | null,
      inserted: SessionEvent,
    ): Promise<KnownEvents> {
      const known = knownEvents.get(orderId);
      if ((known?.lastId ?? 0) === (lastIdAtLock ?? 0)) return withAdded(known, [inserted]);
      const rows: StoredEventRow[] = await managerOf(tx).query(
        'SELECT id, payload, server_time AS serverTime, recorded_by AS recordedBy FROM session_event WHERE order_id = ? AND id > ? ORDER BY id',
        [orderId, known?.lastId ?? 0],
      );
      return withAdded(known, rows.map(toSessionEvent));
    },

    rememberEvents(orderId: number, read: KnownEvents): void {
      const known = knownEvents.get(orderId);
      if (known && known.lastId >= read.lastId) return;
      knownEvents.delete(orderId);
      if (knownEvents.size >= knownEventsMax) knownEvents.delete(knownEvents.keys().next().value!);
      knownEvents.set(orderId, read);
    },

    forgetEvents(orderId: number): void {
      knownEvents.delete(orderId);
    },

    /** Records that a person nursed the session; asks the database only the first time this process sees them. */
    async addNurse(tx: Transaction, orderId: number, userId: number): Promise<() => void> {
      const key = `${orderId}:${userId}`;
      if (!knownNurses.has(key)) await addParticipant(tx, orderId, userId, 'nursed');
      return () => {
        if (knownNurses.size >= knownEventsMax * 4) knownNurses.clear();
        knownNurses.add(key);
      };
    },

    /** One stored event by its idempotency key (for answering a replayed send). */
    async findEventByKey(
      idempotencyKey: string,
    ): Promise<(SessionEvent & { orderId: number }) | null> {
      const [row]: (StoredEventRow & { orderId: number })[] = await dataSource.query(
        'SELECT id, order_id AS orderId, payload, server_time AS serverTime, recorded_by AS recordedBy FROM session_event WHERE idempotency_key = ?',
        [idempotencyKey],
      );
      return row ? { ...toSessionEvent(row), orderId: Number(row.orderId) } : null;
    },

    /**
     * Stores one event; a key already stored fails with ER_DUP_ENTRY. Returns the event as it
     * would be read back (the payload's stored text parsed, the receipt time to the ms).
     * `payload` is what is kept of the input (a password never is); `receivedAt` the server's
     * receipt time by the app's clock.
     */
    async insertEvent(
      tx: Transaction,
      orderId: number,
      recordedBy: number,
      input: SessionEventInput,
      payload: Record<string, unknown>,
      receivedAt: Date,
    ): Promise<SessionEvent> {
      const stored = JSON.stringify(payload);
      const result = await quickQuery<{ insertId: number | string }>(
        dataSource,
        tx,
        'INSERT INTO session_event (order_id, idempotency_key, type, step_id, client_time, server_time, recorded_by, payload) VALUES (?, ?, ?, ?, ?, ?, ?, ?)',
        [
          orderId,
          input.idempotencyKey,
          input.type,
          'stepId' in input ? input.stepId : null,
          new Date(input.clientTime),
          receivedAt,
          recordedBy,
          stored,
        ],
      );
      return toSessionEvent({
        id: result.insertId,
        payload: stored,
        serverTime: receivedAt,
        recordedBy,
      });
    },

    /** One statement whether the record exists or not: this runs on every event. */
    saveRecord: (
      tx: Transaction,
      orderId: number,
      record: DoseRecord,
      extra: {
        protocolVersionId: number;
        unitTimeZone: string;
        deviationCount: number;
        order: RecordOrderFacts;
      },
    ) =>
      quickQuery(
        dataSource,
        tx,
        `INSERT INTO dose_record (order_id, outcome, started_at, ended_at, on_time_s, delivered_fluence_j_per_cm2, volume_given_ml, record, protocol_version_id, local_month, deviation_count,
                                  eye, patient_id, planned_dose_mg, planned_fluence_j_per_cm2)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)
         ON DUPLICATE KEY UPDATE outcome = VALUES(outcome), started_at = VALUES(started_at), ended_at = VALUES(ended_at), on_time_s = VALUES(on_time_s),
           delivered_fluence_j_per_cm2 = VALUES(delivered_fluence_j_per_cm2), volume_given_ml = VALUES(volume_given_ml), record = VALUES(record),
           protocol_version_id = VALUES(protocol_version_id), local_month = VALUES(local_month), deviation_count = VALUES(deviation_count),
           eye = VALUES(eye), patient_id = VALUES(patient_id), planned_dose_mg = VALUES(planned_dose_mg), planned_fluence_j_per_cm2 = VALUES(planned_fluence_j_per_cm2), updated_at = CURRENT_TIMESTAMP(3)`,
        [
          orderId,
          record.outcome,
          record.sessionStartedAt ? new Date(record.sessionStartedAt) : null,
          record.endedAt ? new Date(record.endedAt) : null,
          record.kind === 'pdt' ? (record.lightOnS ?? null) : (record.uvOnS ?? null),
          record.deliveredFluenceJPerCm2 ?? null,
          record.kind === 'pdt' ? (record.volumeGivenMl ?? null) : null,
          JSON.stringify(record),
          extra.protocolVersionId,
          record.endedAt
            ? DateTime.fromISO(record.endedAt).setZone(extra.unitTimeZone).toFormat('yyyy-MM')
            : null,
          extra.deviationCount,
          extra.order.eye,
          extra.order.patientId,
          extra.order.plannedDoseMg,
          extra.order.plannedFluenceJPerCm2,
        ],
      ),

    /** The names of the nurses who ran an order's session (each tap's recorder), first tap first. */
    nursesOf: async (orderId: number): Promise<string[]> => {
      const rows: { displayName: string }[] = await dataSource.query(
        "SELECT u.display_name AS displayName FROM session_participant sp JOIN user u ON u.id = sp.user_id WHERE sp.order_id = ? AND sp.part = 'nursed' ORDER BY sp.user_id",
        [orderId],
      );
      return rows.map((row) => row.displayName);
    },

    /** The order's status, or null when there is no such order. */
    async orderStatus(orderId: number): Promise<string | null> {
      return (await this.orderFacts(orderId))?.status ?? null;
    },

    /** What the session's state needs of its order: status, plan and the protocol it was signed on. */
    async orderFacts(orderId: number): Promise<{
      status: string;
      plan: unknown;
      protocolVersionId: number;
      protocolSha256: string;
    } | null> {
      const [order] = await dataSource.query(
        'SELECT status, plan, protocol_version_id AS protocolVersionId, protocol_sha256 AS protocolSha256 FROM treatment_order WHERE id = ?',
        [orderId],
      );
      if (!order) return null;
      return {
        status: String(order.status),
        plan: typeof order.plan === 'string' ? JSON.parse(order.plan) : order.plan,
        protocolVersionId: Number(order.protocolVersionId),
        protocolSha256: String(order.protocolSha256),
      };
    },

    /** Deviations of the order still waiting for review (withdrawn ones do not count). */
    async openDeviationCount(tx: Transaction, orderId: number): Promise<number> {
      const [{ open }] = await managerOf(tx).query(
        "SELECT COUNT(*) AS open FROM deviation WHERE order_id = ? AND review_status = 'open' AND withdrawn_at IS NULL",
        [orderId],
      );
      return Number(open);
    },

    recordFor: (orderId: number) => dataSource.getRepository(DoseRecordRow).findOneBy({ orderId }),

    deviationsFor: (orderId: number, tx?: Transaction) =>
      (managerOf(tx) ?? dataSource.manager)
        .getRepository(DeviationRow)
        .find({ where: { orderId }, order: { detectedAt: 'ASC', id: 'ASC' } }),

    /**
     * Brings the stored deviations in line with what the record now shows: new ones are added,
     * changed figures follow, and ones that no longer hold are withdrawn, never deleted.
     * Returns the types that are new.
     */
    async reconcileDeviations(
      tx: Transaction,
      orderId: number,
      protocolVersionId: number,
      found: Deviation[],
      /** The server's time: when a new deviation is detected or a gone one withdrawn. */
      at: Date,
      /** The order's deviations as already read with its lock (`lockForSession`); read here when not given. */
      storedAlready?: StoredDeviation[],
    ): Promise<{ added: string[]; standing: StandingDeviation[] }> {
      const repo = managerOf(tx).getRepository(DeviationRow);
      // Read on every event, so plain SQL rather than the ORM's query builder.
      const rows: StoredDeviation[] =
        storedAlready ??
        (await managerOf(tx).query(
          'SELECT id, type, severity, expected, actual, message, detected_at AS detectedAt, withdrawn_at AS withdrawnAt FROM deviation WHERE order_id = ?',
          [orderId],
        ));
      const stored = new Map(rows.map((row) => [row.type, row]));
      const added: string[] = [];
      const standing: StandingDeviation[] = [];
      for (const deviation of found) {
        const row = stored.get(deviation.type);
        const values = {
          severity: deviation.severity,
          expected: deviation.expected,
          actual: deviation.actual,
          unit: deviation.unit,
          message: deviation.message.slice(0, 600),
          withdrawnAt: null,
        };
        // A deviation is dated by the event that caused it, so a withdrawn tap's time never
        // stays on it (shared/session/deviations.ts); without such an event, when it was found.
        const causedAt = deviation.at ? new Date(deviation.at) : null;
        if (!row) {
          const detectedAt = causedAt ?? at;
          const result = await repo.insert({
            orderId,
            protocolVersionId,
            type: deviation.type,
            ...values,
            detectedAt,
          });
          added.push(deviation.type);
          standing.push({
            id: Number(result.identifiers[0]!.id),
            type: deviation.type,
            ...values,
            detectedAt: detectedAt.toISOString(),
          });
        } else {
          const detectedAt =
            causedAt && causedAt.getTime() !== new Date(row.detectedAt).getTime()
              ? causedAt
              : new Date(row.detectedAt);
          if (
            detectedAt !== row.detectedAt ||
            row.withdrawnAt ||
            row.severity !== values.severity ||
            row.expected !== values.expected ||
            row.actual !== values.actual ||
            row.message !== values.message
          ) {
            await repo.update({ id: row.id }, { ...values, detectedAt });
          }
          standing.push({
            id: row.id,
            type: deviation.type,
            ...values,
            detectedAt: detectedAt.toISOString(),
          });
        }
        stored.delete(deviation.type);
      }
      for (const gone of stored.values())
        if (!gone.withdrawnAt) await repo.update({ id: gone.id }, { withdrawnAt: at });
      return { added, standing };
    },
  };
}

export type SessionRepository = ReturnType<typeof createSessionRepository>;
