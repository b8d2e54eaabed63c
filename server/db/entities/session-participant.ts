import { Entity, Index, PrimaryColumn } from 'typeorm';

/**
 * Who took part in a treatment and how (ordered, checked, prepared, ran the session). Used to
 * filter by staff member and to keep people from reviewing their own sessions.
 */
@Entity({ name: 'session_participant' })
@Index('ix_session_participant_user', ['userId', 'orderId'])
export class SessionParticipant {
  @PrimaryColumn({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @PrimaryColumn({ name: 'user_id', type: 'int', unsigned: true })
  userId!: number;

  @PrimaryColumn({ type: 'varchar', length: 16 })
  part!: 'ordered' | 'checked' | 'prepared' | 'nursed';
}
