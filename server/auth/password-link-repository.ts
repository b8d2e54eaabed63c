import type { DataSource } from 'typeorm';
import { managerOf, type Transaction } from '../db/unit-of-work';
import type { PasswordLinkPurpose } from '../db/entities/password-link';

export interface PasswordLinkRow {
  id: number;
  userId: number;
  purpose: PasswordLinkPurpose;
  used: boolean;
  expired: boolean;
}

/** The password_link table; only SHA-256 hashes of the tokens are ever stored. */
export function createPasswordLinkRepository(dataSource: DataSource) {
  return {
    /** A new link replaces any the person still had. */
    async insert(
      tx: Transaction,
      link: {
        tokenHash: string;
        userId: number;
        purpose: PasswordLinkPurpose;
        createdBy: number | null;
        lifetimeS: number;
      },
    ): Promise<void> {
      await managerOf(tx).query(
        'UPDATE password_link SET used_at = NOW(3) WHERE user_id = ? AND used_at IS NULL',
        [link.userId],
      );
      await managerOf(tx).query(
        'INSERT INTO password_link (token_hash, user_id, purpose, created_by, expires_at) VALUES (?, ?, ?, ?, NOW(3) + INTERVAL ? SECOND)',
        [link.tokenHash, link.userId, link.purpose, link.createdBy, Math.round(link.lifetimeS)],
      );
    },

    async find(tokenHash: string): Promise<PasswordLinkRow | null> {
      const [row] = await dataSource.query(
        'SELECT id, user_id AS userId, purpose, used_at IS NOT NULL AS used, expires_at <= NOW(3) AS expired FROM password_link WHERE token_hash = ?',
        [tokenHash],
      );
      return row
        ? {
            id: Number(row.id),
            userId: Number(row.userId),
            purpose: row.purpose,
            used: Boolean(Number(row.used)),
            expired: Boolean(Number(row.expired)),
          }
        : null;
    },

    /** Marks the link used if it still works; false when another request used it first or it ran out. */
    async consume(tx: Transaction, id: number): Promise<boolean> {
      const result = await managerOf(tx).query(
        'UPDATE password_link SET used_at = NOW(3) WHERE id = ? AND used_at IS NULL AND expires_at > NOW(3)',
        [id],
      );
      return Number(result?.affectedRows ?? 0) === 1;
    },
  };
}

export type PasswordLinkRepository = ReturnType<typeof createPasswordLinkRepository>;
