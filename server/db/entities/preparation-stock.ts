import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryColumn,
  type Relation,
} from 'typeorm';
import { Preparation } from './preparation';
import { StockLotRow } from './stock-lot';

/**
 * What one preparation took from stock (the lot, null when recorded outside stock), the vials it
 * opened, and the drug discarded with its reason. Append-only, beside its preparation.
 */
@Entity({ name: 'preparation_stock' })
@Index('ix_prep_stock_lot', ['stockLotId'])
@Index('ix_prep_stock_created', ['createdAt'])
export class PreparationStockRow {
  @PrimaryColumn({ name: 'preparation_id', type: 'int', unsigned: true })
  preparationId!: number;

  @ManyToOne(() => Preparation, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'preparation_id' })
  preparation!: Relation<Preparation>;

  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @Column({ name: 'stock_lot_id', type: 'int', unsigned: true, nullable: true })
  stockLotId!: number | null;

  @ManyToOne(() => StockLotRow, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'stock_lot_id' })
  stockLot!: Relation<StockLotRow> | null;

  @Column({ name: 'vials_opened', type: 'smallint', unsigned: true })
  vialsOpened!: number;

  @Column({ name: 'dose_mg', type: 'double' })
  doseMg!: number;

  @Column({ name: 'discarded_mg', type: 'double' })
  discardedMg!: number;

  @Column({ name: 'discard_reason', type: 'varchar', length: 500, nullable: true })
  discardReason!: string | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
