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

/** A complication or adverse event after a treatment, linked to its session (order) and, if seen there, a visit. */
@Entity({ name: 'complication' })
@Index('ix_complication_order', ['orderId'])
@Index('ix_complication_review', ['reviewedAt', 'recordedAt'])
export class Complication {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @ManyToOne(() => TreatmentOrder, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'order_id' })
  order!: Relation<TreatmentOrder>;

  @Column({ name: 'follow_up_visit_id', type: 'int', unsigned: true, nullable: true })
  followUpVisitId!: number | null;

  @Column({ name: 'patient_id', type: 'int', unsigned: true })
  patientId!: number;

  @Column({ type: 'enum', enum: ['right', 'left'] })
  eye!: 'right' | 'left';

  /** An id from the protocol's followUp.complicationKinds, with its label as it read then. */
  @Column({ type: 'varchar', length: 64 })
  kind!: string;

  @Column({ name: 'kind_label', type: 'varchar', length: 120 })
  kindLabel!: string;

  @Column({ type: 'enum', enum: ['mild', 'moderate', 'severe'] })
  severity!: 'mild' | 'moderate' | 'severe';

  @Column({ name: 'onset_on', type: 'date' })
  onsetOn!: string;

  @Column({
    type: 'enum',
    enum: ['resolved', 'resolving', 'ongoing', 'resolved-with-sequelae'],
  })
  outcome!: 'resolved' | 'resolving' | 'ongoing' | 'resolved-with-sequelae';

  @Column({ type: 'varchar', length: 1000, nullable: true })
  note!: string | null;

  @Column({ name: 'recorded_by', type: 'int', unsigned: true })
  recordedBy!: number;

  @Column({ name: 'recorded_at', type: 'datetime', precision: 3 })
  recordedAt!: Date;

  /** The auditor who looked at it; null while it waits in the auditor's queue. */
  @Column({ name: 'reviewed_by', type: 'int', unsigned: true, nullable: true })
  reviewedBy!: number | null;

  @Column({ name: 'reviewed_at', type: 'datetime', precision: 3, nullable: true })
  reviewedAt!: Date | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
