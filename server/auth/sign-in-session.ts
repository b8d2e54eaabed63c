import { createHash, randomBytes } from 'node:crypto';
import type { CookieOptions, RequestHandler } from 'express';
import jwt from 'jsonwebtoken';
import type { Capability, Role } from '../../shared/roles';
import type { Config } from '../config';
import { AppError } from '../http/app-error';
import { capabilitiesOf } from './permissions';
import type { SignInSessionRepository } from './sign-in-session-repository';

export const signInCookieName = 'luxtempo_session';
/**
 * A readable companion to the httpOnly session cookie. It holds no secret, only "a sign-in session was
 * started here", so the client can skip asking `/api/auth/me` (and logging a 401) when nobody
 * has signed in. The server never trusts it.
 */
export const signInHintCookieName = 'luxtempo_signed_in';

export interface SignedInUser {
  id: number;
  email: string;
  displayName: string;
  roles: Role[];
  capabilities: Capability[];
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      user?: SignedInUser;
      /** The sign_in_session row this call came with. */
      signInSessionId?: string;
    }
  }
}

export function signedInUser(res: { locals: { user?: SignedInUser } }): SignedInUser {
  const user = res.locals.user;
  if (!user) throw AppError.unauthorised();
  return user;
}

export function signedInSessionId(res: { locals: { signInSessionId?: string } }): string {
  const id = res.locals.signInSessionId;
  if (!id) throw AppError.unauthorised();
  return id;
}

const sha256Hex = (text: string) => createHash('sha256').update(text).digest('hex');

/** Seconds between writes of a sign-in session's last-seen time: the idle limit is that coarse, and reads stay reads. */
export const touchEveryS = 60;

export function createSignInSessions(config: Config, rows: SignInSessionRepository) {
  const cookieOptions: CookieOptions = {
    httpOnly: true,
    sameSite: 'strict',
    secure: config.COOKIE_SECURE,
    path: '/',
  };
  const lifetimeS = Math.round(config.SESSION_HOURS * 3600);
  const idleLimitS = config.SESSION_IDLE_MIN * 60;

  /** Starts a sign-in session: a row keyed by the hash of a random id, and a signed cookie carrying the id. */
  async function issue(
    userId: number,
    ipAddress: string | undefined,
  ): Promise<{ token: string; maxAgeMs: number }> {
    const sessionKey = randomBytes(32).toString('base64url');
    await rows.insert({ tokenHash: sha256Hex(sessionKey), userId, lifetimeS, ipAddress });
    const token = jwt.sign({}, config.JWT_SECRET, {
      algorithm: 'HS256',
      subject: String(userId),
      jwtid: sessionKey,
      expiresIn: lifetimeS,
      issuer: 'luxtempo',
    });
    return { token, maxAgeMs: lifetimeS * 1000 };
  }

  /**
   * Tokens already checked, with their subject, session hash and expiry. Checking an HS256
   * signature costs about half a millisecond and a session sends the same token with every call,
   * so each token's signature is checked once per process. This says only that the token is
   * genuine: whether its session still counts is read from the database on every call, so no
   * process can honour a session another has ended.
   */
  const checkedTokens = new Map<
    string,
    { userId: number; tokenHash: string; expiresAtMs: number }
  >();
  const checkedTokensMax = 10_000;

  function verifiedToken(token: string): { userId: number; tokenHash: string } | null {
    const known = checkedTokens.get(token);
    if (known) {
      if (known.expiresAtMs > Date.now()) return known;
      checkedTokens.delete(token);
      return null;
    }
    try {
      const payload = jwt.verify(token, config.JWT_SECRET, {
        algorithms: ['HS256'],
        issuer: 'luxtempo',
      });
      if (
        typeof payload !== 'object' ||
        typeof payload.exp !== 'number' ||
        typeof payload.jti !== 'string' ||
        payload.jti.length < 32
      )
        return null;
      const userId = Number(payload.sub);
      if (!Number.isInteger(userId) || userId <= 0) return null;
      const checked = {
        userId,
        tokenHash: sha256Hex(payload.jti),
        expiresAtMs: payload.exp * 1000,
      };
      if (checkedTokens.size >= checkedTokensMax)
        checkedTokens.delete(checkedTokens.keys().next().value!);
      checkedTokens.set(token, checked);
      return checked;
    } catch {
      return null;
    }
  }

  /** The sign-in session a request's cookie names, if its token is genuine (for sign-out). */
  function tokenOf(
    cookies: Record<string, unknown> | undefined,
  ): { userId: number; tokenHash: string } | null {
    const token = cookies?.[signInCookieName];
    return typeof token === 'string' && token.length > 0 ? verifiedToken(token) : null;
  }

  const requireSignIn: RequestHandler = async (req, res, next) => {
    const token: unknown = req.cookies?.[signInCookieName];
    if (typeof token !== 'string' || token.length === 0) return next(AppError.unauthorised());
    const checked = verifiedToken(token);
    if (checked === null)
      return next(
        AppError.unauthorised('Your session has ended or is not valid. Please sign in again.'),
      );
    const signInSession = await rows.find(checked.tokenHash);
    if (
      !signInSession ||
      signInSession.userId !== checked.userId ||
      signInSession.revoked ||
      signInSession.ended
    ) {
      return next(AppError.unauthorised('Your session has ended. Please sign in again.'));
    }
    if (signInSession.idleS >= idleLimitS) {
      await rows.revoke({ signInSessionId: signInSession.signInSessionId }, 'idle');
      return next(
        AppError.unauthorised(
          `You were signed out after ${config.SESSION_IDLE_MIN} minutes without activity. Please sign in again.`,
        ),
      );
    }
    if (!signInSession.active)
      return next(AppError.unauthorised('This account cannot sign in. Ask an administrator.'));
    if (signInSession.idleS >= touchEveryS) await rows.touch(signInSession.signInSessionId);
    res.locals.signInSessionId = signInSession.signInSessionId;
    res.locals.user = {
      id: signInSession.userId,
      email: signInSession.email,
      displayName: signInSession.displayName,
      roles: signInSession.roles,
      capabilities: capabilitiesOf(signInSession.roles),
    };
    next();
  };

  const requireCapability =
    (capability: Capability): RequestHandler =>
    (_req, res, next) => {
      if (res.locals.user?.capabilities.includes(capability)) return next();
      next(AppError.forbidden());
    };

  return {
    cookieOptions,
    issue,
    tokenOf,
    requireSignIn,
    requireCapability,
    revoke: rows.revoke,
    revokeAllOf: rows.revokeAllOf,
    idleLimitS,
  };
}

export type SignInSessions = ReturnType<typeof createSignInSessions>;
