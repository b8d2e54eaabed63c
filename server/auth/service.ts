import type {
  ChangePassword,
  LoginRequest,
  PasswordLinkInfo,
  SetPassword,
} from '../../shared/schemas/auth';
import type { AuditRepository } from '../audit/repository';
import type { UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import type { UserRepository } from '../people/repository';
import type { PasswordLinkRepository } from './password-link-repository';
import { hashLinkToken } from './password-links';
import { checkNewPassword, hashPassword, verifyPassword } from './passwords';
import { capabilitiesOf } from './permissions';
import type { SignedInUser } from './sign-in-session';
import type { SignInSessionRepository } from './sign-in-session-repository';
import type { Throttle } from './throttle';

const invalidCredentials = () =>
  new AppError(
    401,
    'invalid_credentials',
    'The e-mail or password is not right, or the account cannot sign in.',
  );

const linkGone = () =>
  new AppError(
    410,
    'link_not_valid',
    'This link has been used, has expired or was replaced by a newer one. Ask an administrator to send a new link.',
  );

interface Deps {
  unitOfWork: UnitOfWork;
  users: UserRepository;
  signInSessions: SignInSessionRepository;
  links: PasswordLinkRepository;
  throttle: Throttle;
  audit: AuditRepository;
}

export function createAuthService({
  unitOfWork,
  users,
  signInSessions,
  links,
  throttle,
  audit,
}: Deps) {
  /**
   * Checks a person's own password, for signing in and at every signature prompt: the same
   * throttle, the same verification, and an older hash upgraded once the password is known.
   */
  async function checkPassword(
    email: string,
    password: string,
    ipAddress: string | undefined,
    what: string,
  ) {
    const keys = { email, ipAddress };
    await throttle.assertMayTry(keys, what);
    const user = await users.findByEmail(email);
    const check = await verifyPassword(password, user?.passwordHash);
    if (!user || !check.matches || !user.active) {
      await throttle.recordFailure(keys);
      return {
        user,
        ok: false as const,
        reason: !user ? 'unknown-email' : !check.matches ? 'wrong-password' : 'deactivated',
      };
    }
    await throttle.recordSuccess(keys);
    if (check.needsUpgrade)
      await users.rehashPassword(user.id, user.passwordHash, await hashPassword(password));
    return { user, ok: true as const };
  }

  return {
    async login(input: LoginRequest, ipAddress: string | undefined): Promise<SignedInUser> {
      const result = await checkPassword(input.email, input.password, ipAddress, 'sign-ins');
      if (!result.ok) {
        await audit.append({
          actorUserId: result.user?.id ?? null,
          action: 'sign-in.failed',
          entityType: 'user',
          entityId: result.user?.id ?? null,
          ipAddress,
          details: { email: input.email.trim().toLowerCase(), reason: result.reason },
        });
        // One message for every failure: it must not tell a guesser which e-mails exist.
        throw invalidCredentials();
      }
      const { user } = result;
      await audit.append({
        actorUserId: user.id,
        action: 'sign-in',
        entityType: 'user',
        entityId: user.id,
        ipAddress,
      });
      return {
        id: user.id,
        email: user.email,
        displayName: user.displayName,
        roles: user.roles,
        capabilities: capabilitiesOf(user.roles),
      };
    },

    /** The signature prompt: the signer's own password, throttled like a sign-in. */
    async confirmSignature(
      userId: number,
      password: string,
      ipAddress: string | undefined,
    ): Promise<boolean> {
      const user = await users.findById(userId);
      if (!user) return false;
      return (await checkPassword(user.email, password, ipAddress, 'password entries')).ok;
    },

    async logout(
      signInSession: { userId: number; tokenHash: string } | null,
      ipAddress: string | undefined,
    ): Promise<void> {
      if (!signInSession) return;
      await signInSessions.revoke({ tokenHash: signInSession.tokenHash }, 'signed-out');
      await audit.append({
        actorUserId: signInSession.userId,
        action: 'sign-out',
        entityType: 'user',
        entityId: signInSession.userId,
        ipAddress,
      });
    },

    /** A person changes their own password; every other session of theirs ends. */
    async changePassword(
      actor: { id: number; signInSessionId: string; ipAddress?: string },
      input: ChangePassword,
    ): Promise<void> {
      const user = await users.findById(actor.id);
      if (!user) throw AppError.unauthorised();
      await throttle.assertMayTry(
        { email: user.email, ipAddress: actor.ipAddress },
        'password entries',
      );
      const check = await verifyPassword(input.currentPassword, user.passwordHash);
      if (!check.matches) {
        await throttle.recordFailure({ email: user.email, ipAddress: actor.ipAddress });
        await audit.append({
          actorUserId: user.id,
          action: 'password.change-refused',
          entityType: 'user',
          entityId: user.id,
          ipAddress: actor.ipAddress,
        });
        throw AppError.badRequest('The current password is not right; nothing was changed.', [
          {
            path: 'currentPassword',
            message: 'currentPassword must be the password you sign in with now',
          },
        ]);
      }
      checkNewPassword(input.newPassword, 'newPassword', user);
      if (input.newPassword === input.currentPassword) {
        throw AppError.badRequest('The new password is the same as the current one.', [
          { path: 'newPassword', message: 'newPassword must differ from the current password' },
        ]);
      }
      await users.setPassword(user.id, await hashPassword(input.newPassword));
      await throttle.recordSuccess({ email: user.email, ipAddress: actor.ipAddress });
      const ended = await signInSessions.revokeAllOf(
        user.id,
        'password-changed',
        actor.signInSessionId,
      );
      await audit.append({
        actorUserId: user.id,
        action: 'password.changed',
        entityType: 'user',
        entityId: user.id,
        ipAddress: actor.ipAddress,
        details: { otherSessionsEnded: ended },
      });
    },

    /** What the set-password page shows before the person types: whose link it is. */
    async describeLink(token: string): Promise<PasswordLinkInfo> {
      const link = await links.find(hashLinkToken(token));
      if (!link || link.used || link.expired) throw linkGone();
      const user = await users.findById(link.userId);
      if (!user || !user.active) throw linkGone();
      return { email: user.email, displayName: user.displayName, purpose: link.purpose };
    },

    /** Uses a link: once only, before it expires; every session of the person ends. */
    async setPasswordWithLink(input: SetPassword, ipAddress: string | undefined): Promise<void> {
      const link = await links.find(hashLinkToken(input.token));
      if (!link || link.used || link.expired) throw linkGone();
      const user = await users.findById(link.userId);
      if (!user || !user.active) throw linkGone();
      checkNewPassword(input.password, 'password', user);
      const passwordHash = await hashPassword(input.password);
      await unitOfWork(async (tx) => {
        // Two tabs racing with one link: only one gets past this line.
        if (!(await links.consume(tx, link.id))) throw linkGone();
        await users.setPassword(user.id, passwordHash, tx);
      });
      const ended = await signInSessions.revokeAllOf(user.id, 'password-set');
      await throttle.recordSuccess({ email: user.email, ipAddress });
      await audit.append({
        actorUserId: user.id,
        action: 'password.set-by-link',
        entityType: 'user',
        entityId: user.id,
        ipAddress,
        details: { purpose: link.purpose, sessionsEnded: ended },
      });
    },
  };
}

export type AuthService = ReturnType<typeof createAuthService>;
