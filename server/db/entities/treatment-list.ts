import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A treatment list: a room (and, until the device register links it, a device's label) on one
 * day, from a start time for a session length, cut into equal slots.
 */
@Entity({ name: 'treatment_list' })
@Index('uq_list_date_room_start', ['listDate', 'room', 'startTime'], { unique: true })
export class TreatmentListRow {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'list_date', type: 'date' })
  listDate!: string;

  @Column({ type: 'varchar', length: 60 })
  room!: string;

  @Column({ name: 'device_label', type: 'varchar', length: 60, nullable: true })
  deviceLabel!: string | null;

  @Column({ name: 'start_time', type: 'char', length: 5 })
  startTime!: string;

  @Column({ name: 'session_length_min', type: 'smallint', unsigned: true })
  sessionLengthMin!: number;

  @Column({ name: 'slot_min', type: 'smallint', unsigned: true })
  slotMin!: number;

  @Column({ name: 'created_by', type: 'int', unsigned: true })
  createdById!: number;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
