import type { DataSource } from 'typeorm';

/**
 * The failure counts behind the sign-in throttle (server/auth/throttle.ts). The database's clock
 * (`NOW(3)`) decides every wait, so all API processes agree on it.
 */
export function createThrottleRepository(dataSource: DataSource) {
  return {
    /** Seconds still to wait for the longest-waiting of these keys; 0 when none waits. */
    async longestWaitS(keys: string[]): Promise<number> {
      const rows: { waitS: number | string | null }[] = await dataSource.query(
        'SELECT CEIL(TIMESTAMPDIFF(MICROSECOND, NOW(3), wait_until) / 1000000) AS waitS FROM sign_in_throttle WHERE throttle_key IN (?) AND wait_until > NOW(3)',
        [keys],
      );
      return rows.reduce((longest, row) => Math.max(longest, Number(row.waitS ?? 0)), 0);
    },

    /**
     * Counts one failure on a key. Failures older than the window are forgotten first; from the
     * limit on, the wait doubles with each failure. One statement, so processes never race.
     */
    async countFailure(
      key: string,
      rule: { limit: number; windowS: number; firstWaitS: number },
    ): Promise<void> {
      const { limit, windowS, firstWaitS } = rule;
      await dataSource.query(
        `INSERT INTO sign_in_throttle (throttle_key, failures, last_failure_at, wait_until) VALUES (?, 1, NOW(3), IF(1 >= ?, NOW(3) + INTERVAL ? SECOND, NULL))
         ON DUPLICATE KEY UPDATE
           failures = IF(last_failure_at < NOW(3) - INTERVAL ? SECOND, 1, failures + 1),
           last_failure_at = NOW(3),
           wait_until = IF(failures >= ?, NOW(3) + INTERVAL LEAST(?, ? * POW(2, LEAST(CAST(failures AS SIGNED) - ?, 20))) SECOND, NULL)`,
        [key, limit, firstWaitS, windowS, limit, windowS, firstWaitS, limit],
      );
    },

    async clear(key: string): Promise<void> {
      await dataSource.query('DELETE FROM sign_in_throttle WHERE throttle_key = ?', [key]);
    },
  };
}

export type ThrottleRepository = ReturnType<typeof createThrottleRepository>;
