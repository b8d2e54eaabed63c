import { createHash } from 'node:crypto';

/** The `prev_hash` of the first row. */
export const genesisHash = '0'.repeat(64);

/** The fields of an audit row the chain covers, as stored (details as its stored JSON text). */
export interface ChainedFields {
  occurredAt: Date;
  actorUserId: number | null;
  action: string;
  entityType: string | null;
  entityId: string | null;
  ipAddress: string | null;
  details: string | null;
}

/**
 * SHA-256 over a canonical serialisation: a JSON array, in a fixed order, of a version tag, the
 * previous row's hash and this row's fields (time in UTC ISO 8601 with milliseconds, absent
 * values as null, details as the exact text stored). Changing, removing or reordering any row
 * changes every hash after it. (A frozen copy hashed the rows that existed before the chain: see
 * migration DatabaseIntegrity1796200000000; both must stay equal.)
 */
export function auditRowHash(prevHash: string, row: ChainedFields): string {
  const canonical = JSON.stringify([
    'luxtempo-audit-v1',
    prevHash,
    row.occurredAt.toISOString(),
    row.actorUserId,
    row.action,
    row.entityType,
    row.entityId,
    row.ipAddress,
    row.details,
  ]);
  return createHash('sha256').update(canonical, 'utf8').digest('hex');
}
