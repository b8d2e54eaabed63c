import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

export const fhirDeliveryStatuses = ['pending', 'sent', 'failed', 'superseded'] as const;
export type FhirDeliveryStatus = (typeof fhirDeliveryStatuses)[number];

/**
 * One version of a treatment's FHIR transaction Bundle, waiting to go to the hospital's FHIR
 * server or gone. Written in the transaction that ended the session (or changed its record), and
 * sent by the FHIR outbox worker with retries, so a FHIR server that is down loses nothing.
 * A newer version waiting for the same order supersedes an older one not yet sent.
 */
@Entity({ name: 'fhir_delivery' })
@Index('uq_fhir_delivery_order_version', ['orderId', 'version'], { unique: true })
@Index('ix_fhir_delivery_due', ['status', 'nextAttemptAt'])
export class FhirDelivery {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @Column({ type: 'smallint', unsigned: true })
  version!: number;

  /** What changed the record for this version: the session's end, or a later entry. */
  @Column({ type: 'varchar', length: 60 })
  reason!: string;

  @Column({ type: 'json' })
  bundle!: Record<string, unknown>;

  @Column({ type: 'enum', enum: fhirDeliveryStatuses, default: 'pending' })
  status!: FhirDeliveryStatus;

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

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
