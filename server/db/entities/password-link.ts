import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

export const passwordLinkPurposes = ['new-account', 'reset'] as const;
export type PasswordLinkPurpose = (typeof passwordLinkPurposes)[number];

/**
 * A one-time link to set a password, e-mailed to the person. Only the SHA-256 of its token is
 * kept; it works once, until `expires_at`, and a newer link for the same person replaces it.
 */
@Entity({ name: 'password_link' })
@Index('ix_password_link_user', ['userId'])
export class PasswordLink {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Index('uq_password_link_token', { unique: true })
  @Column({ name: 'token_hash', type: 'char', length: 64 })
  tokenHash!: string;

  @Column({ name: 'user_id', type: 'int', unsigned: true })
  userId!: number;

  @Column({ type: 'enum', enum: passwordLinkPurposes })
  purpose!: PasswordLinkPurpose;

  /** The admin who asked for it; null for the command that creates the first admin. */
  @Column({ name: 'created_by', type: 'int', unsigned: true, nullable: true })
  createdBy!: number | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;

  @Column({ name: 'expires_at', type: 'datetime', precision: 3 })
  expiresAt!: Date;

  /** Set when used, or when a newer link replaced it. */
  @Column({ name: 'used_at', type: 'datetime', precision: 3, nullable: true })
  usedAt!: Date | null;
}
