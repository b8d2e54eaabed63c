import type { Config } from '../config';
import { AppError } from '../http/app-error';
import type { ThrottleRepository } from './throttle-repository';

/**
 * Failed password checks, counted in MariaDB per account and per network address, so every API
 * process sees the same counts and a restart forgets nothing. The `LOGIN_FAILURE_LIMIT`th failure
 * inside `LOGIN_FAILURE_WINDOW_MIN` and each one after it make the next try wait: 30 s, doubling
 * with each further failure, up to the window's length. While a wait runs the password is not even
 * checked (so a guesser learns nothing and a wait cannot be stretched by guessing through it);
 * once it has passed, the right password always works: a guesser can slow an account, never
 * lock its owner out. The sign-in form and the signature prompt share these counts.
 */
export const firstWaitS = 30;

export interface ThrottleKeys {
  /** The account's e-mail, lowercased. */
  email: string;
  ipAddress: string | undefined;
}

function keysOf({ email, ipAddress }: ThrottleKeys): string[] {
  return [`account:${email.trim().toLowerCase()}`, `address:${ipAddress ?? 'unknown'}`];
}

export function tooManyAttempts(retryAfterS: number, what = 'sign-ins'): AppError {
  const minutes = Math.max(1, Math.ceil(retryAfterS / 60));
  const wait =
    retryAfterS < 60
      ? `${retryAfterS} seconds`
      : `about ${minutes} minute${minutes === 1 ? '' : 's'}`;
  return new AppError(
    429,
    'too_many_attempts',
    `Too many failed ${what}. Wait ${wait} and try again, or ask an administrator.`,
    undefined,
    retryAfterS,
  );
}

export function createThrottle(
  rows: ThrottleRepository,
  config: Pick<Config, 'LOGIN_FAILURE_LIMIT' | 'LOGIN_FAILURE_WINDOW_MIN'>,
) {
  const windowS = config.LOGIN_FAILURE_WINDOW_MIN * 60;
  const limit = config.LOGIN_FAILURE_LIMIT;

  return {
    /** Seconds still to wait before a password may be tried for these keys; 0 when none. */
    waitS: (keys: ThrottleKeys): Promise<number> => rows.longestWaitS(keysOf(keys)),

    /** Refuses with 429 and the wait when one is running. */
    async assertMayTry(keys: ThrottleKeys, what?: string): Promise<void> {
      const waitS = await this.waitS(keys);
      if (waitS > 0) throw tooManyAttempts(waitS, what);
    },

    /**
     * Counts one failure on each key. Failures older than the window are forgotten first; past the
     * limit the wait doubles with each failure.
     */
    async recordFailure(keys: ThrottleKeys): Promise<void> {
      for (const key of keysOf(keys)) await rows.countFailure(key, { limit, windowS, firstWaitS });
    },

    /** The right password for an account clears that account's count (an address keeps its own). */
    async recordSuccess(keys: ThrottleKeys): Promise<void> {
      await rows.clear(keysOf(keys)[0]!);
    },
  };
}

export type Throttle = ReturnType<typeof createThrottle>;
