import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { TreatmentOrder } from './treatment-order';

/**
 * One follow-up visit of a treated eye: planned from the protocol when the session completed,
 * then recorded once by a clinician. Acuity is kept as entered and as logMAR.
 */
@Entity({ name: 'follow_up_visit' })
@Index('ux_follow_up_visit_order_key', ['orderId', 'visitKey'], { unique: true })
@Index('ix_follow_up_visit_due', ['recordedAt', 'dueOn'])
@Index('ix_follow_up_visit_patient', ['patientId', 'dueOn'])
export class FollowUpVisit {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @ManyToOne(() => TreatmentOrder, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'order_id' })
  order!: Relation<TreatmentOrder>;

  @Column({ name: 'patient_id', type: 'int', unsigned: true })
  patientId!: number;

  @Column({ type: 'enum', enum: ['right', 'left'] })
  eye!: 'right' | 'left';

  @Column({ type: 'enum', enum: ['pdt', 'cxl'] })
  kind!: 'pdt' | 'cxl';

  /** The protocol version whose follow-up block planned the visit (the order's own, or its newest successor with one). */
  @Column({ name: 'plan_protocol_version_id', type: 'int', unsigned: true })
  planProtocolVersionId!: number;

  @Column({ name: 'visit_key', type: 'varchar', length: 64 })
  visitKey!: string;

  @Column({ name: 'visit_label', type: 'varchar', length: 120 })
  visitLabel!: string;

  @Column({ name: 'offset_days', type: 'smallint', unsigned: true })
  offsetDays!: number;

  /** The unit's calendar date the visit is due (treatment date + offset). */
  @Column({ name: 'due_on', type: 'date' })
  dueOn!: string;

  @Column({ name: 'window_days', type: 'smallint', unsigned: true })
  windowDays!: number;

  @Column({ name: 'seen_on', type: 'date', nullable: true })
  seenOn!: string | null;

  @Column({ name: 'recorded_by', type: 'int', unsigned: true, nullable: true })
  recordedBy!: number | null;

  @Column({ name: 'recorded_at', type: 'datetime', precision: 3, nullable: true })
  recordedAt!: Date | null;

  @Column({ name: 'acuity_notation', type: 'varchar', length: 20, nullable: true })
  acuityNotation!: string | null;

  @Column({ name: 'acuity_entry', type: 'varchar', length: 20, nullable: true })
  acuityEntry!: string | null;

  @Column({ name: 'acuity_log_mar', type: 'double', nullable: true })
  acuityLogMar!: number | null;

  @Column({
    name: 'central_subfield_thickness_um',
    type: 'smallint',
    unsigned: true,
    nullable: true,
  })
  centralSubfieldThicknessUm!: number | null;

  @Column({ name: 'subretinal_fluid', type: 'enum', enum: ['present', 'resolved'], nullable: true })
  subretinalFluid!: 'present' | 'resolved' | null;

  @Column({ type: 'enum', enum: ['none', 'present', 'not-done'], nullable: true })
  leakage!: 'none' | 'present' | 'not-done' | null;

  @Column({
    name: 'retreatment_decision',
    type: 'enum',
    enum: ['retreat', 'observe', 'discharge'],
    nullable: true,
  })
  retreatmentDecision!: 'retreat' | 'observe' | 'discharge' | null;

  @Column({ name: 'kmax_d', type: 'double', nullable: true })
  kmaxD!: number | null;

  @Column({ name: 'thinnest_pachymetry_um', type: 'smallint', unsigned: true, nullable: true })
  thinnestPachymetryUm!: number | null;

  @Column({ name: 'endothelial_cells_per_mm2', type: 'smallint', unsigned: true, nullable: true })
  endothelialCellsPerMm2!: number | null;

  @Column({ name: 'haze_grade', type: 'tinyint', unsigned: true, nullable: true })
  hazeGrade!: number | null;

  @Column({ type: 'varchar', length: 1000, nullable: true })
  note!: string | null;

  /** When the patient's e-mail reminder went into the outbox; null until then. */
  @Column({ name: 'reminder_queued_at', type: 'datetime', precision: 3, nullable: true })
  reminderQueuedAt!: Date | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
