import { createAuditRepository } from '../audit/repository';
import { createPasswordLinkRepository } from '../auth/password-link-repository';
import { createPasswordLinks } from '../auth/password-links';
import { noPasswordYet } from '../auth/passwords';
import type { Config } from '../config';
import { createUnitOfWork, type Database } from '../db/unit-of-work';
import { createUserRepository } from './repository';

/**
 * What `npm run admin:create` does: with demo data off nobody can sign in on a fresh install, so
 * someone with access to the server makes the first administrator, who gets a one-time link
 * (printed, since mail may not be set up yet). The admin holds no clinical role: those need a
 * second administrator. Run for an existing administrator's e-mail, it prints a fresh link
 * (the way back in when the only administrator has lost their password).
 */
export async function createFirstAdmin(
  dataSource: Database,
  config: Config,
  person: { email: string; displayName: string },
): Promise<{ url: string; created: boolean; expiresInHours: number }> {
  const users = createUserRepository(dataSource);
  const audit = createAuditRepository(dataSource);
  const links = createPasswordLinks(
    createUnitOfWork(dataSource),
    createPasswordLinkRepository(dataSource),
    config,
  );
  const existing = await users.findByEmail(person.email);
  if (existing && !existing.roles.includes('admin')) {
    throw new Error(
      `${existing.email} already has an account without the administrator role; an administrator can give it that role on the People page.`,
    );
  }
  if (existing && !existing.active)
    throw new Error(`${existing.email} is deactivated; another administrator can reactivate it.`);
  const user =
    existing ??
    (await users.create({
      email: person.email,
      displayName: person.displayName,
      roles: ['admin'],
      passwordHash: noPasswordYet,
    }));
  await audit.append({
    actorUserId: null,
    action: existing ? 'person.password-link-sent' : 'person.created',
    entityType: 'user',
    entityId: user.id,
    details: { email: user.email, roles: user.roles, by: 'admin:create command' },
  });
  return {
    url: await links.issueForPrinting(user),
    created: !existing,
    expiresInHours: config.PASSWORD_LINK_HOURS,
  };
}
