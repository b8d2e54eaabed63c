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
import { TreatmentListRow } from './treatment-list';
import { TreatmentOrder } from './treatment-order';

/** A signed order booked into one slot of a list. One booking per order, one order per slot. */
@Entity({ name: 'list_booking' })
@Index('uq_booking_slot', ['listId', 'slotIndex'], { unique: true })
@Index('uq_booking_order', ['orderId'], { unique: true })
@Index('ix_booking_patient_date', ['patientId', 'bookingDate'])
export class ListBookingRow {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'list_id', type: 'int', unsigned: true })
  listId!: number;

  @ManyToOne(() => TreatmentListRow, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'list_id' })
  list!: Relation<TreatmentListRow>;

  @Column({ name: 'slot_index', type: 'smallint', unsigned: true })
  slotIndex!: number;

  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @ManyToOne(() => TreatmentOrder, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'order_id' })
  order!: Relation<TreatmentOrder>;

  @Column({ name: 'patient_id', type: 'int', unsigned: true })
  patientId!: number;

  @Column({ type: 'enum', enum: ['right', 'left'] })
  eye!: 'right' | 'left';

  /** The unit's calendar day of the slot (an eye is booked at most once a day). */
  @Column({ name: 'booking_date', type: 'date' })
  bookingDate!: string;

  @Column({ name: 'starts_at', type: 'datetime', precision: 3 })
  startsAt!: Date;

  @Column({ name: 'ends_at', type: 'datetime', precision: 3 })
  endsAt!: Date;

  @Column({ name: 'booked_by', type: 'int', unsigned: true })
  bookedById!: number;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
