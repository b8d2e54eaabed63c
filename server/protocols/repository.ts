import type { DataSource, EntityManager } from 'typeorm';
import { ProtocolApproval } from '../db/entities/protocol-approval';
import { ProtocolVersion } from '../db/entities/protocol-version';

export function createProtocolRepository(dataSource: DataSource) {
  const versions = dataSource.getRepository(ProtocolVersion);
  const approvals = dataSource.getRepository(ProtocolApproval);
  return {
    listAll: () => versions.find({ order: { key: 'ASC', version: 'ASC' }, relations: { approvals: { user: true } } }),
    find: (key: string, version: number) => versions.findOne({ where: { key, version }, relations: { approvals: { user: true } } }),
    /** The newest approved (not retired) version of a protocol, if any. */
    latestApproved: (key: string) => versions.findOne({ where: { key, status: 'approved' }, order: { version: 'DESC' } }),
    async highestVersion(key: string): Promise<number> {
      const row = await versions.createQueryBuilder('v').select('MAX(v.version)', 'max').where('v.key = :key', { key }).getRawOne<{ max: number | null }>();
      return Number(row?.max ?? 0);
    },
    insert: (row: Omit<ProtocolVersion, 'id' | 'createdAt' | 'approvals'>) => versions.save(versions.create(row)),
    updateDraft: (id: number, changes: Pick<ProtocolVersion, 'definition' | 'sha256' | 'title'>) =>
      versions.update({ id, status: 'draft' }, changes),
    /** Runs work in one transaction with the version row locked, so two approvals can't race. */
    async withLockedVersion<T>(id: number, work: (manager: EntityManager, row: ProtocolVersion) => Promise<T>): Promise<T> {
      return dataSource.transaction(async (manager) => {
        const row = await manager.getRepository(ProtocolVersion).findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
        if (!row) throw new Error(`protocol version ${id} vanished`);
        return work(manager, row);
      });
    },
    approvalsOf: (manager: EntityManager, protocolVersionId: number) => manager.getRepository(ProtocolApproval).find({ where: { protocolVersionId } }),
    addApproval: (manager: EntityManager, approval: Pick<ProtocolApproval, 'protocolVersionId' | 'userId' | 'approvedAs' | 'definitionSha256'>) =>
      manager.getRepository(ProtocolApproval).insert(approval),
    setStatus: (manager: EntityManager, id: number, changes: Partial<Pick<ProtocolVersion, 'status' | 'approvedAt' | 'retiredAt' | 'retiredBy'>>) =>
      manager.getRepository(ProtocolVersion).update({ id }, changes),
    approvalCount: () => approvals.count(),
  };
}

export type ProtocolRepository = ReturnType<typeof createProtocolRepository>;
