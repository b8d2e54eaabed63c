import { AppError } from '../http/app-error';
import { checkOrderedDefinition, definitionSha256 } from './definition-hash';
import type { DataSource } from 'typeorm';
import { ProtocolApproval } from '../db/entities/protocol-approval';
import { ProtocolVersion } from '../db/entities/protocol-version';
import { createUnitOfWork, managerOf, type Transaction } from '../db/unit-of-work';

/** The parts of a version that ordering and calculating need. */
export type ProtocolForUse = Pick<
  ProtocolVersion,
  'id' | 'key' | 'version' | 'kind' | 'title' | 'status' | 'sha256' | 'definition'
>;

/**
 * Definitions by id and SHA-256. An approved definition never changes (the database refuses it),
 * and a draft's edit changes its SHA-256, so an entry is right for as long as its hash matches.
 */
const definitionCache = new Map<
  number,
  { sha256: string; definition: ProtocolVersion['definition'] }
>();

/**
 * The definition of a version an order points at. Orders only ever use approved versions, and
 * an approved definition never changes (the database refuses it), so it is read once per process.
 */
export async function orderedDefinition(
  tx: Transaction,
  order: { id: number; protocolVersionId: number; protocolSha256: string },
): Promise<ProtocolVersion['definition']> {
  let cached = definitionCache.get(order.protocolVersionId);
  if (!cached) {
    const [stored] = await managerOf(tx).query(
      'SELECT definition, sha256, status FROM protocol_version WHERE id = ?',
      [order.protocolVersionId],
    );
    const definition =
      typeof stored.definition === 'string' ? JSON.parse(stored.definition) : stored.definition;
    // The fingerprint is computed from what was read, never taken from the row's own column.
    cached = { sha256: definitionSha256(definition), definition };
    if (stored.status !== 'draft') definitionCache.set(order.protocolVersionId, cached);
  }
  checkOrderedDefinition(order, cached.sha256);
  return cached.definition;
}

export function createProtocolRepository(dataSource: DataSource) {
  const versions = dataSource.getRepository(ProtocolVersion);
  const approvals = dataSource.getRepository(ProtocolApproval);
  return {
    /**
     * The version named (or the newest approved one): a small indexed read per call, with the
     * definition itself from memory — the calculation route's hot path.
     */
    async findForUse(key: string, version?: number): Promise<ProtocolForUse | null> {
      const rows: {
        id: number;
        version: number;
        kind: 'pdt' | 'cxl';
        title: string;
        status: ProtocolVersion['status'];
        sha256: string;
      }[] =
        version === undefined
          ? await dataSource.query(
              "SELECT id, version, kind, title, status, sha256 FROM protocol_version WHERE protocol_key = ? AND status = 'approved' ORDER BY version DESC LIMIT 1",
              [key],
            )
          : await dataSource.query(
              'SELECT id, version, kind, title, status, sha256 FROM protocol_version WHERE protocol_key = ? AND version = ?',
              [key, version],
            );
      const row = rows[0];
      if (!row) return null;
      let cached = definitionCache.get(row.id);
      if (cached?.sha256 !== row.sha256) {
        const [stored] = await dataSource.query(
          'SELECT definition, sha256 FROM protocol_version WHERE id = ?',
          [row.id],
        );
        const definition =
          typeof stored.definition === 'string' ? JSON.parse(stored.definition) : stored.definition;
        if (definitionSha256(definition) !== stored.sha256) {
          throw AppError.conflict(
            'protocol_fingerprint_mismatch',
            `Protocol ${key} version ${row.version}: its definition does not match its stored fingerprint; it cannot be used. Ask the administrator to check the protocol versions.`,
          );
        }
        cached = { sha256: stored.sha256, definition };
        definitionCache.set(row.id, cached);
      }
      return { ...row, key, definition: cached.definition };
    },
    listAll: () =>
      versions.find({
        order: { key: 'ASC', version: 'ASC' },
        relations: { approvals: { user: true } },
      }),
    find: (key: string, version: number) =>
      versions.findOne({ where: { key, version }, relations: { approvals: { user: true } } }),
    /** The newest approved (not retired) version of a protocol, if any. */
    latestApproved: (key: string) =>
      versions.findOne({ where: { key, status: 'approved' }, order: { version: 'DESC' } }),
    async highestVersion(key: string): Promise<number> {
      const row = await versions
        .createQueryBuilder('v')
        .select('MAX(v.version)', 'max')
        .where('v.key = :key', { key })
        .getRawOne<{ max: number | null }>();
      return Number(row?.max ?? 0);
    },
    insert: (
      row: Omit<
        ProtocolVersion,
        'id' | 'createdAt' | 'approvals' | 'discardedAt' | 'discardedBy' | 'discardReason'
      >,
    ) => versions.save(versions.create(row)),
    updateDraft: (id: number, changes: Pick<ProtocolVersion, 'definition' | 'sha256' | 'title'>) =>
      versions.update({ id, status: 'draft' }, changes),
    /** Runs work in one transaction with the version row locked, so two approvals can't race. */
    async withLockedVersion<T>(
      id: number,
      work: (tx: Transaction, row: ProtocolVersion) => Promise<T>,
    ): Promise<T> {
      return createUnitOfWork(dataSource)(async (tx) => {
        const row = await managerOf(tx)
          .getRepository(ProtocolVersion)
          .findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
        if (!row) throw new Error(`protocol version ${id} vanished`);
        return work(tx, row);
      });
    },
    approvalsOf: (tx: Transaction, protocolVersionId: number) =>
      managerOf(tx).getRepository(ProtocolApproval).find({ where: { protocolVersionId } }),
    addApproval: (
      tx: Transaction,
      approval: Pick<
        ProtocolApproval,
        'protocolVersionId' | 'userId' | 'approvedAs' | 'meaning' | 'definitionSha256'
      >,
    ) => managerOf(tx).getRepository(ProtocolApproval).insert(approval),
    setStatus: (
      tx: Transaction,
      id: number,
      changes: Partial<
        Pick<
          ProtocolVersion,
          | 'status'
          | 'approvedAt'
          | 'retiredAt'
          | 'retiredBy'
          | 'discardedAt'
          | 'discardedBy'
          | 'discardReason'
        >
      >,
    ) => managerOf(tx).getRepository(ProtocolVersion).update({ id }, changes),
    approvalCount: () => approvals.count(),
  };
}

export type ProtocolRepository = ReturnType<typeof createProtocolRepository>;
