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
import { StockLotRow } from './stock-lot';

/** Every change to a lot's quantity, who made it and why: received, issued to a preparation, or a count adjusted. Append-only. */
@Entity({ name: 'stock_movement' })
@Index('ix_movement_lot', ['lotId', 'id'])
@Index('ix_movement_kind_time', ['kind', 'occurredAt'])
export class StockMovementRow {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'lot_id', type: 'int', unsigned: true })
  lotId!: number;

  @ManyToOne(() => StockLotRow, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'lot_id' })
  stockLot!: Relation<StockLotRow>;

  @Column({ type: 'enum', enum: ['received', 'issued', 'adjusted'] })
  kind!: 'received' | 'issued' | 'adjusted';

  @Column({ name: 'quantity_change', type: 'int' })
  quantityChange!: number;

  @Column({ name: 'quantity_after', type: 'int', unsigned: true })
  quantityAfter!: number;

  @Column({ type: 'varchar', length: 500, nullable: true })
  reason!: string | null;

  @Column({ name: 'order_id', type: 'int', unsigned: true, nullable: true })
  orderId!: number | null;

  @Column({ name: 'actor_id', type: 'int', unsigned: true })
  actorId!: number;

  @CreateDateColumn({
    name: 'occurred_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  occurredAt!: Date;
}
