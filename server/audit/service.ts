import type { Clock } from '../clock';
import type { AuditRepository } from './repository';

/** Repeated reads of one record by one person within this window make one audit row (the first). */
export const readAuditWindowMs = 60_000;

export type ReadAction =
  'patient.viewed' | 'order.viewed' | 'order.fhir-read' | 'attachment.viewed' | 'export.downloaded';

export interface Reader {
  id: number;
  ipAddress?: string | null;
}

/**
 * Who read which health record, and when: opening a patient, an order or an attachment, and
 * every export. A screen that refreshes an open order every few seconds would bury the trail, so
 * repeated reads of the same record by the same person are batched into the first row of each
 * minute (per API process). Exports are never batched: each one is a copy leaving the system.
 * The row is written before the data is sent; if it cannot be written, nothing is read.
 */
export function createReadAudit(audit: AuditRepository, clock: Clock) {
  const lastNoted = new Map<string, number>();
  return {
    async note(
      reader: Reader,
      read: {
        action: ReadAction;
        entityType: string;
        entityId: string | number;
        details?: Record<string, unknown>;
      },
    ) {
      const key = `${reader.id}|${read.action}|${read.entityType}|${read.entityId}`;
      const at = clock.now().getTime();
      if (read.action !== 'export.downloaded') {
        const last = lastNoted.get(key);
        if (last !== undefined && at - last < readAuditWindowMs) return;
        if (lastNoted.size > 10_000)
          for (const [k, t] of lastNoted) if (at - t >= readAuditWindowMs) lastNoted.delete(k);
      }
      await audit.append({
        actorUserId: reader.id,
        action: read.action,
        entityType: read.entityType,
        entityId: read.entityId,
        ipAddress: reader.ipAddress,
        details: read.details ?? null,
      });
      if (read.action !== 'export.downloaded') lastNoted.set(key, at);
    },
  };
}

export type ReadAudit = ReturnType<typeof createReadAudit>;

export function createAuditService(audit: AuditRepository) {
  return {
    /** Recomputes the hash chain over every audit row; names the first row that does not match. */
    verifyChain: () => audit.verifyChain(),
  };
}

export type AuditService = ReturnType<typeof createAuditService>;
