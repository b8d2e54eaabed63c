import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

export const outboxStatuses = ['pending', 'sent', 'failed'] as const;
export type OutboxStatus = (typeof outboxStatuses)[number];

/**
 * An e-mail waiting to go, or gone. Written in the same breath as the change it reports, and sent
 * by the outbox worker with retries, so a dead mail server delays mail but never loses it.
 */
@Entity({ name: 'outbox_message' })
@Index('ix_outbox_due', ['status', 'nextAttemptAt'])
export class OutboxMessage {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 64 })
  kind!: string;

  @Column({ type: 'json' })
  recipients!: string[];

  @Column({ type: 'varchar', length: 200 })
  subject!: string;

  @Column({ type: 'text' })
  body!: string;

  @Column({ type: 'enum', enum: outboxStatuses, default: 'pending' })
  status!: OutboxStatus;

  @Column({ type: 'smallint', unsigned: true, default: 0 })
  attempts!: number;

  @Column({
    name: 'next_attempt_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  nextAttemptAt!: Date;

  @Column({ name: 'last_error', type: 'varchar', length: 500, nullable: true })
  lastError!: string | null;

  @Column({ name: 'sent_at', type: 'datetime', precision: 3, nullable: true })
  sentAt!: Date | null;

  @Column({ name: 'related_type', type: 'varchar', length: 40, nullable: true })
  relatedType!: string | null;

  @Column({ name: 'related_id', type: 'varchar', length: 40, nullable: true })
  relatedId!: string | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
