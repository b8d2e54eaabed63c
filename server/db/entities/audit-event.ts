import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * Who did what to which record, and when. Append-only: the app's database user may INSERT and
 * SELECT here, never UPDATE or DELETE (server/db/grants.ts). Each row carries a hash chained to the
 * one before, so a change made around the app (as the owner, or in the files) shows in
 * `npm run audit:verify`.
 */
@Entity({ name: 'audit_event' })
@Index('ix_audit_event_occurred_at', ['occurredAt'])
@Index('ix_audit_event_entity', ['entityType', 'entityId'])
@Index('ix_audit_event_actor', ['actorUserId', 'occurredAt'])
export class AuditEvent {
  // BIGINT comes back from mysql2 as a string; that is fine for an identifier.
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @CreateDateColumn({
    name: 'occurred_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  occurredAt!: Date;

  @Column({ name: 'actor_user_id', type: 'int', unsigned: true, nullable: true })
  actorUserId!: number | null;

  @Column({ type: 'varchar', length: 64 })
  action!: string;

  @Column({ name: 'entity_type', type: 'varchar', length: 64, nullable: true })
  entityType!: string | null;

  @Column({ name: 'entity_id', type: 'varchar', length: 64, nullable: true })
  entityId!: string | null;

  @Column({ name: 'ip_address', type: 'varchar', length: 64, nullable: true })
  ipAddress!: string | null;

  @Column({ type: 'json', nullable: true })
  details!: Record<string, unknown> | null;

  /** The previous row's `hash` (64 zeros for the first row). */
  @Column({ name: 'prev_hash', type: 'char', length: 64 })
  prevHash!: string;

  /** SHA-256 of the previous hash and this row's fields (server/audit/chain.ts). */
  @Column({ type: 'char', length: 64 })
  hash!: string;
}
