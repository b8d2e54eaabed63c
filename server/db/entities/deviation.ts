import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import {
  reviewClassifications,
  reviewStatuses,
  type ReviewClassification,
  type ReviewStatus,
} from '../../../shared/schemas/reviews';
import {
  deviationSeverities,
  type DeviationSeverity,
} from '../../../shared/session/session-events';

/**
 * A departure from protocol found in a session's record. One row per order and type; when late
 * events change the figures the row follows them, and if the departure no longer holds it is
 * marked withdrawn rather than deleted.
 */
@Entity({ name: 'deviation' })
@Index('uq_deviation_order_type', ['orderId', 'type'], { unique: true })
// The auditor's queue always asks for standing (not withdrawn) deviations, newest first, with
// at most one more filter: each index serves one such page without a sort.
@Index('ix_deviation_detected', ['withdrawnAt', 'detectedAt'])
@Index('ix_deviation_review_detected', ['reviewStatus', 'withdrawnAt', 'detectedAt'])
@Index('ix_deviation_protocol_detected', ['protocolVersionId', 'withdrawnAt', 'detectedAt'])
@Index('ix_deviation_type_detected', ['type', 'withdrawnAt', 'detectedAt'])
@Index('ix_deviation_severity_detected', ['severity', 'withdrawnAt', 'detectedAt'])
export class DeviationRow {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @Column({ type: 'varchar', length: 40 })
  type!: string;

  @Column({ type: 'enum', enum: deviationSeverities })
  severity!: DeviationSeverity;

  @Column({ type: 'double', nullable: true })
  expected!: number | null;

  @Column({ type: 'double', nullable: true })
  actual!: number | null;

  @Column({ type: 'varchar', length: 20, nullable: true })
  unit!: string | null;

  @Column({ type: 'varchar', length: 600 })
  message!: string;

  @Column({
    name: 'detected_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  detectedAt!: Date;

  @Column({ name: 'withdrawn_at', type: 'datetime', precision: 3, nullable: true })
  withdrawnAt!: Date | null;

  /** Copied from the order so the auditor's queue filters without a join. */
  @Column({ name: 'protocol_version_id', type: 'int', unsigned: true, nullable: true })
  protocolVersionId!: number | null;

  @Column({ name: 'review_status', type: 'enum', enum: reviewStatuses, default: 'open' })
  reviewStatus!: ReviewStatus;

  @Column({ type: 'enum', enum: reviewClassifications, nullable: true })
  classification!: ReviewClassification | null;

  @Column({ name: 'reviewed_by', type: 'int', unsigned: true, nullable: true })
  reviewedBy!: number | null;

  @Column({ name: 'reviewed_at', type: 'datetime', precision: 3, nullable: true })
  reviewedAt!: Date | null;
}
