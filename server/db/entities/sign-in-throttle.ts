import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * Failed password checks per account and per network address, shared by every API process and
 * kept across restarts. Past the allowed number each failure doubles the wait before the next
 * try; the right password after the wait always works.
 */
@Entity({ name: 'sign_in_throttle' })
export class SignInThrottle {
  /** `account:<e-mail>` or `address:<ip>`. */
  @PrimaryColumn({ name: 'throttle_key', type: 'varchar', length: 300 })
  throttleKey!: string;

  @Column({ type: 'int', unsigned: true, default: 0 })
  failures!: number;

  @Column({ name: 'last_failure_at', type: 'datetime', precision: 3 })
  lastFailureAt!: Date;

  @Column({ name: 'wait_until', type: 'datetime', precision: 3, nullable: true })
  waitUntil!: Date | null;
}
