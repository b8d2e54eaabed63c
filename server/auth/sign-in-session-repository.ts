import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import { quickQuery } from '../db/quick-query';

export interface SignInSessionRow {
  signInSessionId: string;
  userId: number;
  email: string;
  displayName: string;
  roles: Role[];
  active: boolean;
  /** Seconds since the session was last seen, by the database's clock. */
  idleS: number;
  /** Past its maximum lifetime. */
  ended: boolean;
  revoked: boolean;
}

/** The session read's row as the driver gives it. */
interface FoundRow {
  signInSessionId: string | number;
  userId: number;
  email: string;
  displayName: string;
  roles: string | null;
  active: number | string;
  idleS: number | string;
  ended: number | string;
  revoked: number | string;
}

/** The sign_in_session table. Times come from the database's clock, the same for every process. */
export function createSignInSessionRepository(dataSource: DataSource) {
  return {
    async insert(row: {
      tokenHash: string;
      userId: number;
      lifetimeS: number;
      ipAddress: string | undefined;
    }): Promise<void> {
      await dataSource.query(
        'INSERT INTO sign_in_session (token_hash, user_id, expires_at, ip_address) VALUES (?, ?, NOW(3) + INTERVAL ? SECOND, ?)',
        [row.tokenHash, row.userId, row.lifetimeS, row.ipAddress?.slice(0, 64) ?? null],
      );
      // Rows long past their end are of no use; a few go with each sign-in.
      await dataSource.query(
        'DELETE FROM sign_in_session WHERE expires_at < NOW(3) - INTERVAL 30 DAY LIMIT 100',
      );
    },

    /**
     * The one read every signed-in call makes: the session and its person, by the unique token
     * hash, in one indexed query.
     */
    async find(tokenHash: string): Promise<SignInSessionRow | null> {
      // Straight through the driver (server/db/quick-query.ts): every signed-in call sends it.
      const [row] = await quickQuery<FoundRow[]>(
        dataSource,
        undefined,
        `SELECT s.id AS signInSessionId, u.id AS userId, u.email, u.display_name AS displayName, u.roles, u.active,
                TIMESTAMPDIFF(SECOND, s.last_seen_at, NOW(3)) AS idleS, s.expires_at <= NOW(3) AS ended, s.revoked_at IS NOT NULL AS revoked
           FROM sign_in_session s JOIN user u ON u.id = s.user_id WHERE s.token_hash = ?`,
        [tokenHash],
      );
      if (!row) return null;
      return {
        signInSessionId: String(row.signInSessionId),
        userId: Number(row.userId),
        email: row.email,
        displayName: row.displayName,
        roles: row.roles ? (String(row.roles).split(',') as Role[]) : [],
        active: Boolean(Number(row.active)),
        idleS: Number(row.idleS),
        ended: Boolean(Number(row.ended)),
        revoked: Boolean(Number(row.revoked)),
      };
    },

    async touch(signInSessionId: string): Promise<void> {
      await dataSource.query('UPDATE sign_in_session SET last_seen_at = NOW(3) WHERE id = ?', [
        signInSessionId,
      ]);
    },

    async revoke(
      where: { signInSessionId: string } | { tokenHash: string },
      reason: string,
    ): Promise<number> {
      const [column, value] =
        'signInSessionId' in where
          ? ['id', where.signInSessionId]
          : ['token_hash', where.tokenHash];
      const result = await dataSource.query(
        `UPDATE sign_in_session SET revoked_at = NOW(3), revoked_reason = ? WHERE ${column} = ? AND revoked_at IS NULL`,
        [reason, value],
      );
      return Number(result?.affectedRows ?? 0);
    },

    /** Ends every session of a person (or all but one); returns how many were open. */
    async revokeAllOf(
      userId: number,
      reason: string,
      exceptSignInSessionId?: string,
    ): Promise<number> {
      const result = await dataSource.query(
        `UPDATE sign_in_session SET revoked_at = NOW(3), revoked_reason = ? WHERE user_id = ? AND revoked_at IS NULL AND expires_at > NOW(3)${exceptSignInSessionId ? ' AND id <> ?' : ''}`,
        exceptSignInSessionId ? [reason, userId, exceptSignInSessionId] : [reason, userId],
      );
      return Number(result?.affectedRows ?? 0);
    },

    async countOpen(userId: number, idleS: number): Promise<number> {
      const [row] = await dataSource.query(
        'SELECT COUNT(*) AS n FROM sign_in_session WHERE user_id = ? AND revoked_at IS NULL AND expires_at > NOW(3) AND last_seen_at > NOW(3) - INTERVAL ? SECOND',
        [userId, idleS],
      );
      return Number(row?.n ?? 0);
    },
  };
}

export type SignInSessionRepository = ReturnType<typeof createSignInSessionRepository>;
