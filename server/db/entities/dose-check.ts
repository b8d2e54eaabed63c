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
import { User } from './user';

/** A pharmacist's independent figures for one order and how they compared. Append-only. */
@Entity({ name: 'dose_check' })
@Index('ix_dose_check_order', ['orderId', 'createdAt'])
export class DoseCheck {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @ManyToOne(() => TreatmentOrder, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'order_id' })
  order!: Relation<TreatmentOrder>;

  @Column({ name: 'pharmacist_id', type: 'int', unsigned: true })
  pharmacistId!: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'pharmacist_id' })
  pharmacist!: Relation<User>;

  @Column({ name: 'bsa_m2', type: 'double' })
  bsaM2!: number;

  @Column({ name: 'dose_mg', type: 'double' })
  doseMg!: number;

  @Column({ name: 'drug_volume_ml', type: 'double' })
  drugVolumeMl!: number;

  @Column({ type: 'enum', enum: ['match', 'mismatch'] })
  outcome!: 'match' | 'mismatch';

  /** Which figures fell outside the tolerance, e.g. ["doseMg"]. */
  @Column({ type: 'json' })
  differing!: string[];

  @Column({ type: 'varchar', length: 1000, nullable: true })
  comment!: string | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
