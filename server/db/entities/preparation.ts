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

/**
 * How the drug for one order was made up. Normally one per order; a drug past its beyond-use time
 * is discarded and made up again, and then the latest (highest id) is the one that counts.
 */
@Entity({ name: 'preparation' })
@Index('ix_preparation_order', ['orderId', 'id'])
// A recall searches preparations by the lot's text.
@Index('ix_preparation_vial_lot', ['vialLot'])
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

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
