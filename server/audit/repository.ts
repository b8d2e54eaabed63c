import type { DataSource } from 'typeorm';
import type { AuditChainReport } from '../../shared/schemas/audit';
import { AuditEvent } from '../db/entities/audit-event';
import { auditRowHash, genesisHash, type ChainedFields } from './chain';

export interface AuditEntry {
  actorUserId: number | null;
  action: string;
  entityType?: string | null;
  entityId?: string | number | null;
  ipAddress?: string | null;
  details?: Record<string, unknown> | null;
}

type StoredRow = ChainedFields & { id: string; prevHash: string; hash: string };

/**
 * Walks the audit trail in id order and recomputes each row's hash from the one before. Reports
 * the first row whose stored hash or link does not match (the row that was changed, or the one
 * after a row that was removed), and whether the chain's head still points at the last row.
 */
export async function verifyAuditChain(
  dataSource: DataSource,
  batchSize = 2000,
): Promise<AuditChainReport> {
  let prevHash = genesisHash;
  let lastId = '0';
  let checked = 0;
  for (;;) {
    const rows: StoredRow[] = await dataSource.query(
      `SELECT id, occurred_at AS occurredAt, actor_user_id AS actorUserId, action, entity_type AS entityType, entity_id AS entityId,
              ip_address AS ipAddress, details, prev_hash AS prevHash, hash
         FROM audit_event WHERE id > ? ORDER BY id LIMIT ?`,
      [lastId, batchSize],
    );
    if (rows.length === 0) break;
    for (const row of rows) {
      const fields: ChainedFields = {
        ...row,
        actorUserId: row.actorUserId == null ? null : Number(row.actorUserId),
        details: detailsText(row.details),
      };
      const expected = auditRowHash(prevHash, fields);
      if (row.prevHash !== prevHash) {
        return {
          ok: false,
          checked,
          firstBrokenId: String(row.id),
          reason:
            'Its link to the row before does not match: a row before it was removed, added or changed.',
        };
      }
      if (row.hash !== expected) {
        return {
          ok: false,
          checked,
          firstBrokenId: String(row.id),
          reason: 'Its contents do not match its hash: the row was changed after it was written.',
        };
      }
      prevHash = row.hash;
      lastId = String(row.id);
      checked++;
    }
  }
  const [head] = await dataSource.query(
    'SELECT last_event_id AS lastEventId, last_hash AS lastHash FROM audit_chain_head WHERE id = 1',
  );
  if (!head || head.lastHash !== prevHash || String(head.lastEventId ?? '0') !== lastId) {
    return {
      ok: false,
      checked,
      firstBrokenId: null,
      reason:
        'The chain’s head does not point at the last row: rows at the end were removed or added around the app.',
    };
  }
  return { ok: true, checked, firstBrokenId: null, reason: null };
}

function detailsText(details: unknown): string | null {
  if (details == null) return null;
  return typeof details === 'string' ? details : JSON.stringify(details);
}

export function createAuditRepository(dataSource: DataSource) {
  const repo = dataSource.getRepository(AuditEvent);
  return {
    /**
     * Appends one row, chained to the one before. The chain's head row is locked for the few
     * statements this takes, so rows written at once from any process still form one chain in id
     * order. Call it after the main transaction (DEVELOPERS.md, "Hot paths"), never inside one.
     * There is deliberately no update or delete here.
     */
    async append(entry: AuditEntry): Promise<void> {
      await dataSource.transaction(async (manager) => {
        const [head] = await manager.query(
          'SELECT last_hash AS lastHash FROM audit_chain_head WHERE id = 1 FOR UPDATE',
        );
        if (!head) throw new Error('The audit chain has no head row: run the migrations.');
        const fields: ChainedFields = {
          // Milliseconds, as the column keeps them, so the hash covers exactly what is stored.
          occurredAt: new Date(Date.now()),
          actorUserId: entry.actorUserId,
          action: entry.action,
          entityType: entry.entityType ?? null,
          entityId: entry.entityId == null ? null : String(entry.entityId),
          ipAddress: entry.ipAddress ?? null,
          details: entry.details == null ? null : JSON.stringify(entry.details),
        };
        const hash = auditRowHash(head.lastHash, fields);
        const result = await manager.query(
          'INSERT INTO audit_event (occurred_at, actor_user_id, action, entity_type, entity_id, ip_address, details, prev_hash, hash) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)',
          [
            fields.occurredAt,
            fields.actorUserId,
            fields.action,
            fields.entityType,
            fields.entityId,
            fields.ipAddress,
            fields.details,
            head.lastHash,
            hash,
          ],
        );
        await manager.query(
          'UPDATE audit_chain_head SET last_event_id = ?, last_hash = ? WHERE id = 1',
          [result.insertId, hash],
        );
      });
    },
    async listFor(filter: {
      entityType?: string;
      entityId?: string;
      action?: string;
      limit?: number;
    }): Promise<AuditEvent[]> {
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
    verifyChain: () => verifyAuditChain(dataSource),
  };
}

export type AuditRepository = ReturnType<typeof createAuditRepository>;
