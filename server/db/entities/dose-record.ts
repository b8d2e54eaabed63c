import { Column, Entity, Index, PrimaryColumn, UpdateDateColumn } from 'typeorm';
import type { DoseRecord } from '../../../shared/session/dose-record';

/** What was actually given, derived from the session's events; rewritten as each event arrives. */
@Entity({ name: 'dose_record' })
@Index('ix_dose_record_ended', ['endedAt'])
@Index('ix_dose_record_protocol_ended', ['protocolVersionId', 'endedAt'])
@Index('ix_dose_record_month', ['localMonth', 'protocolVersionId'])
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

  @Column({ name: 'protocol_version_id', type: 'int', unsigned: true, nullable: true })
  protocolVersionId!: number | null;

  /** The unit's calendar month of the session (e.g. 2026-11), fixed when it ends, for monthly figures. */
  @Column({ name: 'local_month', type: 'char', length: 7, nullable: true })
  localMonth!: string | null;

  /*
   * Facts of the order, copied here when the record is written so that reports and exports over
   * every session read this table alone: the orders hold each plan's JSON and are too large to
   * read whole for that. They never change once the order is signed.
   */
  @Column({ type: 'enum', enum: ['right', 'left'], nullable: true })
  eye!: 'right' | 'left' | null;

  @Column({ name: 'patient_id', type: 'int', unsigned: true, nullable: true })
  patientId!: number | null;

  @Column({ name: 'planned_dose_mg', type: 'double', nullable: true })
  plannedDoseMg!: number | null;

  @Column({ name: 'planned_fluence_j_per_cm2', type: 'double', nullable: true })
  plannedFluenceJPerCm2!: number | null;

  /** Deviations standing for this session (not withdrawn). */
  @Column({ name: 'deviation_count', type: 'smallint', unsigned: true, default: 0 })
  deviationCount!: number;

  @UpdateDateColumn({
    name: 'updated_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
    onUpdate: 'CURRENT_TIMESTAMP(3)',
  })
  updatedAt!: Date;
}
