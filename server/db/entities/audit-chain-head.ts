import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * The newest link of the audit trail's hash chain: one row, locked by every append
 * (`SELECT … FOR UPDATE`), so rows written at once still form one chain in id order.
 */
@Entity({ name: 'audit_chain_head' })
export class AuditChainHead {
  @PrimaryColumn({ type: 'tinyint', unsigned: true })
  id!: number;

  @Column({ name: 'last_event_id', type: 'bigint', unsigned: true, nullable: true })
  lastEventId!: string | null;

  @Column({ name: 'last_hash', type: 'char', length: 64 })
  lastHash!: string;
}
