import type { CookieOptions, RequestHandler } from 'express';
import jwt from 'jsonwebtoken';
import type { Capability, Role } from '../../shared/roles';
import type { Config } from '../config';
import { AppError } from '../http/app-error';
import type { UserRepository } from '../people/repository';
import { capabilitiesOf } from './permissions';

export const sessionCookieName = 'luxtempo_session';
/**
 * A readable companion to the httpOnly session cookie. It holds no secret, only "a session was
 * started here", so the client can skip asking `/api/auth/me` (and logging a 401) when nobody
 * has signed in. The server never trusts it.
 */
export const sessionHintCookieName = 'luxtempo_signed_in';

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
    }
  }
}

export function signedInUser(res: { locals: { user?: SignedInUser } }): SignedInUser {
  const user = res.locals.user;
  if (!user) throw AppError.unauthorised();
  return user;
}

export function createSessions(config: Config, users: UserRepository) {
  const cookieOptions: CookieOptions = {
    httpOnly: true,
    sameSite: 'strict',
    secure: config.COOKIE_SECURE,
    path: '/',
  };

  function issue(userId: number): { token: string; maxAgeMs: number } {
    const token = jwt.sign({}, config.JWT_SECRET, {
      algorithm: 'HS256',
      subject: String(userId),
      expiresIn: `${config.SESSION_HOURS}h`,
      issuer: 'luxtempo',
    });
    return { token, maxAgeMs: config.SESSION_HOURS * 3600_000 };
  }

  /** The signed-in person's id from a valid token, without asking the database (for sign-out). */
  function peekUserId(cookies: Record<string, unknown> | undefined): number | null {
    const token = cookies?.[sessionCookieName];
    if (typeof token !== 'string') return null;
    try {
      const payload = jwt.verify(token, config.JWT_SECRET, { algorithms: ['HS256'], issuer: 'luxtempo' });
      const id = Number(typeof payload === 'object' ? payload.sub : NaN);
      return Number.isInteger(id) && id > 0 ? id : null;
    } catch {
      return null;
    }
  }

  /**
   * Stateless on purpose (any instance can serve any request), but the person is read afresh on
   * every call, so a deactivation or a role change takes effect at once.
   */
  /**
   * Tokens already checked, with their subject and expiry. Checking an HS256 signature with
   * jsonwebtoken costs about half a millisecond; a session sends the same token with every call,
   * so each token is checked once per process. The expiry is still checked on every use.
   */
  const checkedTokens = new Map<string, { userId: number; expiresAtMs: number }>();
  const checkedTokensMax = 10_000;

  function verifiedUserId(token: string): number | null {
    const known = checkedTokens.get(token);
    if (known) {
      if (known.expiresAtMs > Date.now()) return known.userId;
      checkedTokens.delete(token);
      return null;
    }
    try {
      const payload = jwt.verify(token, config.JWT_SECRET, { algorithms: ['HS256'], issuer: 'luxtempo' });
      if (typeof payload !== 'object' || typeof payload.exp !== 'number') return null;
      const userId = Number(payload.sub);
      if (!Number.isInteger(userId) || userId <= 0) return null;
      if (checkedTokens.size >= checkedTokensMax) checkedTokens.delete(checkedTokens.keys().next().value!);
      checkedTokens.set(token, { userId, expiresAtMs: payload.exp * 1000 });
      return userId;
    } catch {
      return null;
    }
  }

  const requireSession: RequestHandler = async (req, res, next) => {
    const token: unknown = req.cookies?.[sessionCookieName];
    if (typeof token !== 'string' || token.length === 0) return next(AppError.unauthorised());
    const id = verifiedUserId(token);
    if (id === null) return next(AppError.unauthorised('Your session has ended or is not valid. Please sign in again.'));
    const user = await users.findSessionUser(id);
    if (!user || !user.active) return next(AppError.unauthorised('This account cannot sign in. Ask an administrator.'));
    res.locals.user = {
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      roles: user.roles,
      capabilities: capabilitiesOf(user.roles),
    };
    next();
  };

  const requireCapability = (capability: Capability): RequestHandler => (_req, res, next) => {
    if (res.locals.user?.capabilities.includes(capability)) return next();
    next(AppError.forbidden());
  };

  return { cookieOptions, issue, peekUserId, requireSession, requireCapability };
}

export type Sessions = ReturnType<typeof createSessions>;
