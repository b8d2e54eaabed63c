import {
  changePasswordSchema,
  loginRequestSchema,
  passwordLinkCheckSchema,
  setPasswordSchema,
} from '../../shared/schemas/auth';
import type { RouteSpec } from '../http/route-table';
import { parseInput } from '../http/validation';
import type { AuthService } from './service';
import {
  signInCookieName,
  signInHintCookieName,
  signedInSessionId,
  signedInUser,
  type SignInSessions,
} from './sign-in-session';

export function authRoutes(auth: AuthService, signIn: SignInSessions): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/auth/login',
      access: 'public',
      handler: async (req, res) => {
        const input = parseInput(loginRequestSchema, req.body);
        const user = await auth.login(input, req.ip);
        const { token, maxAgeMs } = await signIn.issue(user.id, req.ip);
        res.cookie(signInCookieName, token, { ...signIn.cookieOptions, maxAge: maxAgeMs });
        res.cookie(signInHintCookieName, '1', {
          ...signIn.cookieOptions,
          httpOnly: false,
          maxAge: maxAgeMs,
        });
        res.json({ user });
      },
    },
    {
      method: 'post',
      path: '/auth/logout',
      access: 'public',
      handler: async (req, res) => {
        // Signing out always succeeds, even with an ended session; the session row is ended here.
        await auth.logout(signIn.tokenOf(req.cookies), req.ip);
        res.clearCookie(signInCookieName, signIn.cookieOptions);
        res.clearCookie(signInHintCookieName, { ...signIn.cookieOptions, httpOnly: false });
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
    {
      method: 'post',
      path: '/auth/password',
      access: 'signed-in',
      handler: async (req, res) => {
        const input = parseInput(changePasswordSchema, req.body);
        await auth.changePassword(
          { id: signedInUser(res).id, signInSessionId: signedInSessionId(res), ipAddress: req.ip },
          input,
        );
        res.status(204).end();
      },
    },
    {
      method: 'post',
      path: '/auth/password-link/check',
      access: 'public',
      handler: async (req, res) => {
        const { token } = parseInput(passwordLinkCheckSchema, req.body);
        res.json({ link: await auth.describeLink(token) });
      },
    },
    {
      method: 'post',
      path: '/auth/password-link',
      access: 'public',
      handler: async (req, res) => {
        const input = parseInput(setPasswordSchema, req.body);
        await auth.setPasswordWithLink(input, req.ip);
        res.status(204).end();
      },
    },
  ];
}
