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
import { Patient } from './patient';
import { TreatmentOrder } from './treatment-order';

/**
 * A height and weight as recorded on a signed order: the value and unit typed, and the same in
 * cm and kg. Written once when the order is signed, never changed (append-only); a signed order
 * that is amended keeps its row, and readers leave out rows of replaced revisions.
 */
@Entity({ name: 'patient_measurement' })
@Index('ix_patient_measurement_patient', ['patientId', 'measuredAt'])
export class PatientMeasurement {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'patient_id', type: 'int', unsigned: true })
  patientId!: number;

  @ManyToOne(() => Patient, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'patient_id' })
  patient!: Relation<Patient>;

  @Index('uq_patient_measurement_order', { unique: true })
  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @ManyToOne(() => TreatmentOrder, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'order_id' })
  order!: Relation<TreatmentOrder>;

  /** When the order carrying the measurements was signed. */
  @Column({ name: 'measured_at', type: 'datetime', precision: 3 })
  measuredAt!: Date;

  @Column({ name: 'height_value', type: 'double', nullable: true })
  heightValue!: number | null;

  @Column({ name: 'height_unit', type: 'varchar', length: 4, nullable: true })
  heightUnit!: 'cm' | 'in' | 'm' | null;

  @Column({ name: 'height_cm', type: 'double', nullable: true })
  heightCm!: number | null;

  @Column({ name: 'weight_value', type: 'double', nullable: true })
  weightValue!: number | null;

  @Column({ name: 'weight_unit', type: 'varchar', length: 4, nullable: true })
  weightUnit!: 'kg' | 'lb' | null;

  @Column({ name: 'weight_kg', type: 'double', nullable: true })
  weightKg!: number | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
