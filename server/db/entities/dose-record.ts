import { Column, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm';
import type { DoseRecord } from '../../../shared/session/dose-record';

/** What was actually given, derived from the session's events; rewritten as each event arrives. */
@Entity({ name: 'dose_record' })
export class DoseRecordRow {
  @PrimaryColumn({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @Column({ type: 'varchar', length: 16 })
  outcome!: string;

  @Column({ name: 'started_at', type: 'datetime', precision: 3, nullable: true })
  startedAt!: Date | null;

  @Column({ name: 'ended_at', type: 'datetime', precision: 3, nullable: true })
  endedAt!: Date | null;

  @Column({ name: 'on_time_s', type: 'double', nullable: true })
  onTimeS!: number | null;

  @Column({ name: 'delivered_fluence_j_per_cm2', type: 'double', nullable: true })
  deliveredFluenceJPerCm2!: number | null;

  @Column({ name: 'volume_given_ml', type: 'double', nullable: true })
  volumeGivenMl!: number | null;

  @Column({ type: 'json' })
  record!: DoseRecord;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt!: Date;
}
