import type { DataSource } from 'typeorm';
import { AuditEvent } from '../db/entities/audit-event';

export interface AuditEntry {
  actorUserId: number | null;
  action: string;
  entityType?: string | null;
  entityId?: string | number | null;
  ipAddress?: string | null;
  details?: Record<string, unknown> | null;
}

export function createAuditRepository(dataSource: DataSource) {
  const repo = dataSource.getRepository(AuditEvent);
  return {
    /** Appends one row. There is deliberately no update or delete here. */
    async append(entry: AuditEntry): Promise<void> {
      await repo.insert({
        actorUserId: entry.actorUserId,
        action: entry.action,
        entityType: entry.entityType ?? null,
        entityId: entry.entityId == null ? null : String(entry.entityId),
        ipAddress: entry.ipAddress ?? null,
        details: (entry.details ?? null) as AuditEvent['details'] & object,
      });
    },
    async listFor(filter: { entityType?: string; entityId?: string; action?: string; limit?: number }): Promise<AuditEvent[]> {
      return repo.find({
        where: {
          ...(filter.entityType ? { entityType: filter.entityType } : {}),
          ...(filter.entityId ? { entityId: filter.entityId } : {}),
          ...(filter.action ? { action: filter.action } : {}),
        },
        order: { id: 'DESC' },
        take: filter.limit ?? 100,
      });
    },
  };
}

export type AuditRepository = ReturnType<typeof createAuditRepository>;
