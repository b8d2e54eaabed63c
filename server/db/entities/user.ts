import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm';
import { roles, type Role } from '../../../shared/roles';

@Entity({ name: 'user' })
export class User {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Index('uq_user_email', { unique: true })
  @Column({ type: 'varchar', length: 254 })
  email!: string;

  @Column({ name: 'display_name', type: 'varchar', length: 120 })
  displayName!: string;

  @Column({ name: 'password_hash', type: 'varchar', length: 100 })
  passwordHash!: string;

  // A MariaDB SET: the database itself refuses a role that does not exist.
  @Column({ type: 'set', enum: roles })
  roles!: Role[];

  @Column({ type: 'boolean', default: true })
  active!: boolean;

  /** When the person last set their password; null until they first do (a new account's link). */
  @Column({ name: 'password_changed_at', type: 'datetime', precision: 3, nullable: true })
  passwordChangedAt!: Date | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;

  @UpdateDateColumn({
    name: 'updated_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
    onUpdate: 'CURRENT_TIMESTAMP(3)',
  })
  updatedAt!: Date;
}
