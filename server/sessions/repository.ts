import { DateTime } from 'luxon';
import type { DataSource, EntityManager } from 'typeorm';
import type { DoseRecord } from '../../shared/session/dose-record';
import type { Deviation, SessionEvent, SessionEventInput } from '../../shared/session/session-events';
import { DeviationRow } from '../db/entities/deviation';
import { DoseRecordRow } from '../db/entities/dose-record';
import { SessionEventRow } from '../db/entities/session-event';
import type { SessionParticipant } from '../db/entities/session-participant';


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
export function addParticipant(manager: EntityManager, orderId: number, userId: number, part: SessionParticipant['part']) {
  return manager.query('INSERT IGNORE INTO session_participant (order_id, user_id, part) VALUES (?, ?, ?)', [orderId, userId, part]);
}

export function createSessionRepository(dataSource: DataSource) {
  return {
    /** Every event of an order in the order they happened; read on every event, so kept to plain SQL. */
    async eventsFor(orderId: number, manager?: EntityManager): Promise<SessionEvent[]> {
      const rows: { id: string | number; payload: string | Record<string, unknown>; serverTime: Date; recordedBy: number }[] = await (manager ?? dataSource.manager).query(
        'SELECT id, payload, server_time AS serverTime, recorded_by AS recordedBy FROM session_event WHERE order_id = ? ORDER BY client_time, id',
        [orderId],
      );
      return rows.map((row) => ({
        ...((typeof row.payload === 'string' ? JSON.parse(row.payload) : row.payload) as SessionEventInput),
        id: Number(row.id),
        serverTime: row.serverTime.toISOString(),
        recordedBy: row.recordedBy,
      }));
    },

    /** When the drug was made up and must be used by, for the beyond-use deviations. */
    async preparationTimes(manager: EntityManager, orderId: number): Promise<{ reconstitutedAt: string; beyondUseAt: string } | null> {
      const [row] = await manager.query('SELECT reconstituted_at AS reconstitutedAt, beyond_use_at AS beyondUseAt FROM preparation WHERE order_id = ?', [orderId]);
      return row ? { reconstitutedAt: row.reconstitutedAt.toISOString(), beyondUseAt: row.beyondUseAt.toISOString() } : null;
    },

    findEventByKey: (idempotencyKey: string) => dataSource.getRepository(SessionEventRow).findOneBy({ idempotencyKey }),

    insertEvent: (manager: EntityManager, orderId: number, recordedBy: number, input: SessionEventInput) =>
      manager.getRepository(SessionEventRow).insert({
        orderId,
        idempotencyKey: input.idempotencyKey,
        type: input.type,
        stepId: 'stepId' in input ? input.stepId : null,
        clientTime: new Date(input.clientTime),
        recordedBy,
        payload: input as unknown as SessionEventRow['payload'] & object,
      }),

    /** One statement whether the record exists or not: this runs on every event. */
    saveRecord: (manager: EntityManager, orderId: number, record: DoseRecord, extra: { protocolVersionId: number; unitTimeZone: string; deviationCount: number }) =>
      manager.query(
        `INSERT INTO dose_record (order_id, outcome, started_at, ended_at, on_time_s, delivered_fluence_j_per_cm2, volume_given_ml, record, protocol_version_id, local_month, deviation_count)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)
         ON DUPLICATE KEY UPDATE outcome = VALUES(outcome), started_at = VALUES(started_at), ended_at = VALUES(ended_at), on_time_s = VALUES(on_time_s),
           delivered_fluence_j_per_cm2 = VALUES(delivered_fluence_j_per_cm2), volume_given_ml = VALUES(volume_given_ml), record = VALUES(record),
           protocol_version_id = VALUES(protocol_version_id), local_month = VALUES(local_month), deviation_count = VALUES(deviation_count), updated_at = CURRENT_TIMESTAMP(3)`,
        [
          orderId,
          record.outcome,
          record.sessionStartedAt ? new Date(record.sessionStartedAt) : null,
          record.endedAt ? new Date(record.endedAt) : null,
          record.kind === 'pdt' ? record.lightOnS ?? null : record.uvOnS ?? null,
          record.deliveredFluenceJPerCm2 ?? null,
          record.kind === 'pdt' ? record.volumeGivenMl ?? null : null,
          JSON.stringify(record),
          extra.protocolVersionId,
          record.endedAt ? DateTime.fromISO(record.endedAt).setZone(extra.unitTimeZone).toFormat('yyyy-MM') : null,
          extra.deviationCount,
        ],
      ),

    recordFor: (orderId: number) => dataSource.getRepository(DoseRecordRow).findOneBy({ orderId }),

    deviationsFor: (orderId: number, manager?: EntityManager) =>
      (manager ?? dataSource.manager).getRepository(DeviationRow).find({ where: { orderId }, order: { detectedAt: 'ASC', id: 'ASC' } }),

    /**
     * Brings the stored deviations in line with what the record now shows: new ones are added,
     * changed figures follow, and ones that no longer hold are withdrawn, never deleted.
     * Returns the types that are new.
     */
    async reconcileDeviations(manager: EntityManager, orderId: number, protocolVersionId: number, found: Deviation[]): Promise<{ added: string[]; standing: StandingDeviation[] }> {
      const repo = manager.getRepository(DeviationRow);
      const stored = new Map((await repo.find({ where: { orderId } })).map((row) => [row.type, row]));
      const added: string[] = [];
      const standing: StandingDeviation[] = [];
      for (const deviation of found) {
        const row = stored.get(deviation.type);
        const values = { severity: deviation.severity, expected: deviation.expected, actual: deviation.actual, unit: deviation.unit, message: deviation.message.slice(0, 600), withdrawnAt: null };
        if (!row) {
          const detectedAt = new Date();
          const result = await repo.insert({ orderId, protocolVersionId, type: deviation.type, ...values, detectedAt });
          added.push(deviation.type);
          standing.push({ id: Number(result.identifiers[0]!.id), type: deviation.type, ...values, detectedAt: detectedAt.toISOString() });
        } else {
          if (row.withdrawnAt || row.severity !== values.severity || row.expected !== values.expected || row.actual !== values.actual || row.message !== values.message) {
            await repo.update({ id: row.id }, values);
          }
          standing.push({ id: row.id, type: deviation.type, ...values, detectedAt: row.detectedAt.toISOString() });
        }
        stored.delete(deviation.type);
      }
      for (const gone of stored.values()) if (!gone.withdrawnAt) await repo.update({ id: gone.id }, { withdrawnAt: new Date() });
      return { added, standing };
    },
  };
}

export type SessionRepository = ReturnType<typeof createSessionRepository>;
