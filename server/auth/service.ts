import bcrypt from 'bcryptjs';
import type { LoginRequest } from '../../shared/schemas/auth';
import type { AuditRepository } from '../audit/repository';
import { AppError } from '../http/app-error';
import type { UserRepository } from '../people/repository';
import { capabilitiesOf } from './permissions';
import type { SignedInUser } from './session';

// Compared against when the e-mail is unknown, so both failures take the same time.
const hashForUnknownPeople = bcrypt.hashSync('luxtempo-no-such-person', 11);

const invalidCredentials = () =>
  new AppError(401, 'invalid_credentials', 'The e-mail or password is not right, or the account cannot sign in.');

export function createAuthService(users: UserRepository, audit: AuditRepository) {
  return {
    async login(input: LoginRequest, ipAddress: string | undefined): Promise<SignedInUser> {
      const user = await users.findByEmail(input.email);
      const matches = await bcrypt.compare(input.password, user?.passwordHash ?? hashForUnknownPeople);
      if (!user || !matches || !user.active) {
        const reason = !user ? 'unknown-email' : !matches ? 'wrong-password' : 'deactivated';
        await audit.append({
          actorUserId: user?.id ?? null,
          action: 'sign-in.failed',
          entityType: 'user',
          entityId: user?.id ?? null,
          ipAddress,
          details: { email: input.email.trim().toLowerCase(), reason },
        });
        // One message for every failure: it must not tell a guesser which e-mails exist.
        throw invalidCredentials();
      }
      await audit.append({ actorUserId: user.id, action: 'sign-in', entityType: 'user', entityId: user.id, ipAddress });
      return { id: user.id, email: user.email, displayName: user.displayName, roles: user.roles, capabilities: capabilitiesOf(user.roles) };
    },

    async logout(userId: number | null, ipAddress: string | undefined): Promise<void> {
      if (userId) await audit.append({ actorUserId: userId, action: 'sign-out', entityType: 'user', entityId: userId, ipAddress });
    },
  };
}

export type AuthService = ReturnType<typeof createAuthService>;
