import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One tap at the bedside. Append-only (the app may INSERT and SELECT, nothing else), and unique by
 * the client's idempotency key, so a retried or replayed send is stored once.
 */
@Entity({ name: 'session_event' })
@Index('uq_session_event_key', ['idempotencyKey'], { unique: true })
@Index('ix_session_event_order', ['orderId', 'clientTime'])
export class SessionEventRow {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @Column({ name: 'idempotency_key', type: 'char', length: 36 })
  idempotencyKey!: string;

  @Column({ type: 'varchar', length: 32 })
  type!: string;

  @Column({ name: 'step_id', type: 'varchar', length: 64, nullable: true })
  stepId!: string | null;

  @Column({ name: 'client_time', type: 'datetime', precision: 3 })
  clientTime!: Date;

  @Column({
    name: 'server_time',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  serverTime!: Date;

  @Column({ name: 'recorded_by', type: 'int', unsigned: true })
  recordedBy!: number;

  /** The event exactly as the client sent it (validated), for replay and audit. */
  @Column({ type: 'json' })
  payload!: Record<string, unknown>;
}
