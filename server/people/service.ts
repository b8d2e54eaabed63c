import bcrypt from 'bcryptjs';
import type { CreatePerson, Person, UpdatePerson } from '../../shared/schemas/people';
import type { AuditRepository } from '../audit/repository';
import type { User } from '../db/entities/user';
import { AppError } from '../http/app-error';
import type { UserRepository } from './repository';

/** bcrypt cost 2^11: about 0.15 s per hash in pure-JS bcrypt here — slow for a guesser, fine for a person. */
export const passwordHashCost = 11;

export function toPerson(user: User): Person {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    roles: user.roles,
    active: user.active,
    createdAt: user.createdAt.toISOString(),
    updatedAt: user.updatedAt.toISOString(),
  };
}

interface Actor {
  id: number;
  ipAddress?: string | null;
}

export function createPeopleService(users: UserRepository, audit: AuditRepository) {
  return {
    async list(): Promise<Person[]> {
      return (await users.list()).map(toPerson);
    },

    async create(actor: Actor, input: CreatePerson): Promise<Person> {
      if (await users.findByEmail(input.email)) {
        throw AppError.conflict('email_taken', `Someone already has the e-mail ${input.email}.`);
      }
      const passwordHash = await bcrypt.hash(input.password, passwordHashCost);
      let user: User;
      try {
        user = await users.create({ email: input.email, displayName: input.displayName, roles: input.roles, passwordHash });
      } catch (error) {
        if ((error as { code?: string }).code === 'ER_DUP_ENTRY') {
          throw AppError.conflict('email_taken', `Someone already has the e-mail ${input.email}.`);
        }
        throw error;
      }
      await audit.append({
        actorUserId: actor.id,
        action: 'person.created',
        entityType: 'user',
        entityId: user.id,
        ipAddress: actor.ipAddress,
        details: { email: user.email, displayName: user.displayName, roles: user.roles },
      });
      return toPerson(user);
    },

    async update(actor: Actor, id: number, changes: UpdatePerson): Promise<Person> {
      const before = await users.findById(id);
      if (!before) throw AppError.notFound(`No person has the id ${id}.`);
      if (actor.id === id && changes.roles && !changes.roles.includes('admin') && before.roles.includes('admin')) {
        throw AppError.conflict('own_admin_role', 'You cannot remove your own administrator role; ask another administrator.');
      }
      if (actor.id === id && changes.active === false) {
        throw AppError.conflict('own_account', 'You cannot deactivate your own account; ask another administrator.');
      }
      const after = await users.update(id, changes);
      if (!after) throw AppError.notFound(`No person has the id ${id}.`);
      const changed: Record<string, { from: unknown; to: unknown }> = {};
      for (const key of ['displayName', 'roles', 'active'] as const) {
        if (changes[key] !== undefined && JSON.stringify(before[key]) !== JSON.stringify(after[key])) {
          changed[key] = { from: before[key], to: after[key] };
        }
      }
      if (Object.keys(changed).length > 0) {
        const action = changed.active ? (after.active ? 'person.reactivated' : 'person.deactivated') : 'person.updated';
        await audit.append({ actorUserId: actor.id, action, entityType: 'user', entityId: id, ipAddress: actor.ipAddress, details: { changed } });
      }
      return toPerson(after);
    },
  };
}

export type PeopleService = ReturnType<typeof createPeopleService>;
