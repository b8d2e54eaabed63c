import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { deviationSeverities, type DeviationSeverity } from '../../../shared/session/session-events';

/**
 * A departure from protocol found in a session's record. One row per order and type; when late
 * events change the figures the row follows them, and if the departure no longer holds it is
 * marked withdrawn rather than deleted.
 */
@Entity({ name: 'deviation' })
@Index('uq_deviation_order_type', ['orderId', 'type'], { unique: true })
@Index('ix_deviation_detected', ['detectedAt'])
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

  @Column({ name: 'detected_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  detectedAt!: Date;

  @Column({ name: 'withdrawn_at', type: 'datetime', precision: 3, nullable: true })
  withdrawnAt!: Date | null;
}
