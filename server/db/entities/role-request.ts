import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { roles, type Role } from '../../../shared/roles';

export const roleRequestStatuses = ['pending', 'approved', 'rejected', 'withdrawn'] as const;
export type RoleRequestStatus = (typeof roleRequestStatuses)[number];

/**
 * A change of roles that gives someone a clinical role (clinician or pharmacist). It takes effect
 * only when an admin other than the one who asked, and other than the person, approves it.
 */
@Entity({ name: 'role_request' })
@Index('ix_role_request_status', ['status', 'userId'])
export class RoleRequest {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'user_id', type: 'int', unsigned: true })
  userId!: number;

  /** The whole role set the person would hold once approved. */
  @Column({ type: 'set', enum: roles })
  roles!: Role[];

  @Column({ name: 'requested_by', type: 'int', unsigned: true })
  requestedBy!: number;

  @CreateDateColumn({
    name: 'requested_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  requestedAt!: Date;

  @Column({ type: 'enum', enum: roleRequestStatuses, default: 'pending' })
  status!: RoleRequestStatus;

  @Column({ name: 'decided_by', type: 'int', unsigned: true, nullable: true })
  decidedBy!: number | null;

  @Column({ name: 'decided_at', type: 'datetime', precision: 3, nullable: true })
  decidedAt!: Date | null;
}
