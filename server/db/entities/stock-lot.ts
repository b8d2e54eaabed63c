import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One lot of one product in the pharmacy. The quantity is unsigned: an issue that would take it
 * below zero is refused by the conditional update, and by the column as a last guard.
 */
@Entity({ name: 'stock_lot' })
@Index('uq_stock_product_lot', ['product', 'lot'], { unique: true })
@Index('ix_stock_lot_lot', ['lot'])
@Index('ix_stock_product_expiry', ['product', 'expiry'])
export class StockLotRow {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 60 })
  product!: string;

  @Column({ type: 'varchar', length: 40 })
  lot!: string;

  @Column({ type: 'date' })
  expiry!: string;

  @Column({ name: 'quantity_on_hand', type: 'int', unsigned: true })
  quantityOnHand!: number;

  @Column({ name: 'received_quantity', type: 'int', unsigned: true })
  receivedQuantity!: number;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
