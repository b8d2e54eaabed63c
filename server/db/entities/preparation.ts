import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { TreatmentOrder } from './treatment-order';
import { User } from './user';

/** How the drug for one order was made up. One per order. */
@Entity({ name: 'preparation' })
@Index('uq_preparation_order', ['orderId'], { unique: true })
export class Preparation {
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

  @Column({ name: 'vial_lot', type: 'varchar', length: 40 })
  vialLot!: string;

  @Column({ name: 'vial_expiry', type: 'date' })
  vialExpiry!: string;

  @Column({ name: 'reconstituted_at', type: 'datetime', precision: 3 })
  reconstitutedAt!: Date;

  @Column({ name: 'volume_drawn_ml', type: 'double' })
  volumeDrawnMl!: number;

  @Column({ name: 'beyond_use_at', type: 'datetime', precision: 3 })
  beyondUseAt!: Date;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
