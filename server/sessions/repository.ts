import { DateTime } from 'luxon';
import type { DataSource, EntityManager } from 'typeorm';
import type { DoseRecord } from '../../shared/session/dose-record';
import type { Deviation, SessionEvent, SessionEventInput } from '../../shared/session/session-events';
import { DeviationRow } from '../db/entities/deviation';
import { DoseRecordRow } from '../db/entities/dose-record';
import { SessionEventRow } from '../db/entities/session-event';
import type { SessionParticipant } from '../db/entities/session-participant';

export function toSessionEvent(row: SessionEventRow): SessionEvent {
  return { ...(row.payload as SessionEventInput), id: Number(row.id), serverTime: row.serverTime.toISOString(), recordedBy: row.recordedBy };
}

/** Records that a person took part in a treatment; harmless when said twice. */
export function addParticipant(manager: EntityManager, orderId: number, userId: number, part: SessionParticipant['part']) {
  return manager.query('INSERT IGNORE INTO session_participant (order_id, user_id, part) VALUES (?, ?, ?)', [orderId, userId, part]);
}

export function createSessionRepository(dataSource: DataSource) {
  return {
    eventsFor: async (orderId: number, manager?: EntityManager) =>
      (await (manager ?? dataSource.manager).getRepository(SessionEventRow).find({ where: { orderId }, order: { clientTime: 'ASC', id: 'ASC' } })).map(toSessionEvent),

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

    saveRecord: (manager: EntityManager, orderId: number, record: DoseRecord, extra: { protocolVersionId: number; unitTimeZone: string; deviationCount: number }) =>
      manager.getRepository(DoseRecordRow).save({
        orderId,
        protocolVersionId: extra.protocolVersionId,
        localMonth: record.endedAt ? DateTime.fromISO(record.endedAt).setZone(extra.unitTimeZone).toFormat('yyyy-MM') : null,
        deviationCount: extra.deviationCount,
        outcome: record.outcome,
        startedAt: record.sessionStartedAt ? new Date(record.sessionStartedAt) : null,
        endedAt: record.endedAt ? new Date(record.endedAt) : null,
        onTimeS: record.kind === 'pdt' ? record.lightOnS ?? null : record.uvOnS ?? null,
        deliveredFluenceJPerCm2: record.deliveredFluenceJPerCm2 ?? null,
        volumeGivenMl: record.kind === 'pdt' ? record.volumeGivenMl ?? null : null,
        record,
      }),

    recordFor: (orderId: number) => dataSource.getRepository(DoseRecordRow).findOneBy({ orderId }),

    deviationsFor: (orderId: number, manager?: EntityManager) =>
      (manager ?? dataSource.manager).getRepository(DeviationRow).find({ where: { orderId }, order: { detectedAt: 'ASC', id: 'ASC' } }),

    /**
     * Brings the stored deviations in line with what the record now shows: new ones are added,
     * changed figures follow, and ones that no longer hold are withdrawn, never deleted.
     * Returns the types that are new.
     */
    async reconcileDeviations(manager: EntityManager, orderId: number, protocolVersionId: number, found: Deviation[]): Promise<string[]> {
      const repo = manager.getRepository(DeviationRow);
      const stored = new Map((await repo.find({ where: { orderId } })).map((row) => [row.type, row]));
      const added: string[] = [];
      for (const deviation of found) {
        const row = stored.get(deviation.type);
        const values = { severity: deviation.severity, expected: deviation.expected, actual: deviation.actual, unit: deviation.unit, message: deviation.message.slice(0, 600), withdrawnAt: null };
        if (!row) {
          await repo.insert({ orderId, protocolVersionId, type: deviation.type, ...values });
          added.push(deviation.type);
        } else if (row.withdrawnAt || row.severity !== values.severity || row.expected !== values.expected || row.actual !== values.actual || row.message !== values.message) {
          await repo.update({ id: row.id }, values);
        }
        stored.delete(deviation.type);
      }
      for (const gone of stored.values()) if (!gone.withdrawnAt) await repo.update({ id: gone.id }, { withdrawnAt: new Date() });
      return added;
    },
  };
}

export type SessionRepository = ReturnType<typeof createSessionRepository>;
