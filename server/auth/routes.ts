import type { RequestHandler } from 'express';
import { loginRequestSchema } from '../../shared/schemas/auth';
import type { RouteSpec } from '../http/route-table';
import { parseInput } from '../http/validation';
import type { AuthService } from './service';
import { sessionCookieName, sessionHintCookieName, signedInUser, type Sessions } from './session';

export function authRoutes(auth: AuthService, sessions: Sessions, loginLimiters: RequestHandler[]): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/auth/login',
      access: 'public',
      before: loginLimiters,
      handler: async (req, res) => {
        const input = parseInput(loginRequestSchema, req.body);
        const user = await auth.login(input, req.ip);
        const { token, maxAgeMs } = sessions.issue(user.id);
        res.cookie(sessionCookieName, token, { ...sessions.cookieOptions, maxAge: maxAgeMs });
        res.cookie(sessionHintCookieName, '1', { ...sessions.cookieOptions, httpOnly: false, maxAge: maxAgeMs });
        res.json({ user });
      },
    },
    {
      method: 'post',
      path: '/auth/logout',
      access: 'public',
      handler: async (req, res) => {
        // Signing out always succeeds, even with an ended session; it is recorded when we know who.
        await auth.logout(sessions.peekUserId(req.cookies), req.ip);
        res.clearCookie(sessionCookieName, sessions.cookieOptions);
        res.clearCookie(sessionHintCookieName, { ...sessions.cookieOptions, httpOnly: false });
        res.status(204).end();
      },
    },
    {
      method: 'get',
      path: '/auth/me',
      access: 'signed-in',
      handler: (_req, res) => {
        res.json(signedInUser(res));
      },
    },
  ];
}
