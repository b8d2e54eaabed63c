import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One signed-in browser. The cookie's JWT carries a random id whose SHA-256 is stored here, so a
 * stolen copy of this table signs nobody in. A session counts only while this row says so: not
 * revoked, seen within the idle limit and younger than its end. Every API process reads it on
 * every call (with the person, in one query), so a revocation holds everywhere at once.
 */
@Entity({ name: 'sign_in_session' })
@Index('ix_sign_in_session_user', ['userId', 'revokedAt'])
export class SignInSession {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Index('uq_sign_in_session_token', { unique: true })
  @Column({ name: 'token_hash', type: 'char', length: 64 })
  tokenHash!: string;

  @Column({ name: 'user_id', type: 'int', unsigned: true })
  userId!: number;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;

  /** Moved forward at most once a minute, to keep the every-call read free of writes. */
  @Column({
    name: 'last_seen_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  lastSeenAt!: Date;

  @Column({ name: 'expires_at', type: 'datetime', precision: 3 })
  expiresAt!: Date;

  @Column({ name: 'revoked_at', type: 'datetime', precision: 3, nullable: true })
  revokedAt!: Date | null;

  @Column({ name: 'revoked_reason', type: 'varchar', length: 40, nullable: true })
  revokedReason!: string | null;

  @Column({ name: 'ip_address', type: 'varchar', length: 64, nullable: true })
  ipAddress!: string | null;
}
