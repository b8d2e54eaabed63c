import type { Role } from '../../shared/roles';
import {
  clinicalRoles,
  type CreatePerson,
  type Person,
  type RoleRequestView,
  type UpdatePerson,
} from '../../shared/schemas/people';
import type { AuditRepository } from '../audit/repository';
import { noPasswordYet } from '../auth/passwords';
import type { PasswordLinks } from '../auth/password-links';
import type { SignInSessionRepository } from '../auth/sign-in-session-repository';
import type { RoleRequest } from '../db/entities/role-request';
import type { User } from '../db/entities/user';
import { isDuplicateKey } from '../db/errors';
import type { UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import type { RoleRequestRepository, UserRepository } from './repository';

export function toPerson(user: User, pending: RoleRequest | null = null): Person {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    roles: user.roles,
    active: user.active,
    accountReady: user.passwordChangedAt !== null,
    pendingRoleRequest: pending
      ? { id: pending.id, roles: pending.roles, requestedBy: pending.requestedBy }
      : null,
    createdAt: user.createdAt.toISOString(),
    updatedAt: user.updatedAt.toISOString(),
  };
}

interface Actor {
  id: number;
  ipAddress?: string | null;
}

const isClinical = (role: Role) => (clinicalRoles as readonly Role[]).includes(role);

interface Deps {
  unitOfWork: UnitOfWork;
  users: UserRepository;
  roleRequests: RoleRequestRepository;
  signInSessions: SignInSessionRepository;
  passwordLinks: PasswordLinks;
  audit: AuditRepository;
}

/**
 * People and their roles. Giving anyone a clinical role (clinician, pharmacist) is a request that
 * a second administrator approves; nobody can ask for one for themselves or approve their own.
 */
export function createPeopleService({
  unitOfWork,
  users,
  roleRequests,
  signInSessions,
  passwordLinks,
  audit,
}: Deps) {
  async function mustFind(id: number): Promise<User> {
    const user = await users.findById(id);
    if (!user) throw AppError.notFound(`No person has the id ${id}.`);
    return user;
  }

  /** Roles that take effect now and, if any clinical role is being given, the set to request. */
  function splitRoles(
    before: readonly Role[],
    wanted: readonly Role[],
  ): { now: Role[]; request: Role[] | null } {
    const gainsClinical = wanted.some((role) => isClinical(role) && !before.includes(role));
    if (!gainsClinical) return { now: [...wanted], request: null };
    // Until approved, the person keeps what they had, less anything being taken away.
    return { now: before.filter((role) => wanted.includes(role)), request: [...wanted] };
  }

  async function requestRoles(actor: Actor, user: User, roles: Role[]): Promise<RoleRequest> {
    const request = await roleRequests.create({ userId: user.id, roles, requestedBy: actor.id });
    await audit.append({
      actorUserId: actor.id,
      action: 'person.role-change-requested',
      entityType: 'user',
      entityId: user.id,
      ipAddress: actor.ipAddress,
      details: { requestId: request.id, from: user.roles, to: roles },
    });
    return request;
  }

  return {
    /**
     * Names and roles of the unit's staff for the auditor's filters. Only what a filter needs: no
     * e-mail addresses.
     */
    async staff() {
      const rows = await users.staff();
      return rows.map((r) => ({
        id: r.id,
        displayName: r.displayName,
        roles: r.roles ? r.roles.split(',') : [],
        active: Boolean(r.active),
      }));
    },

    async list(): Promise<Person[]> {
      const pending = new Map((await roleRequests.pending()).map((r) => [r.userId, r]));
      return (await users.list()).map((user) => toPerson(user, pending.get(user.id) ?? null));
    },

    /** A new person gets no password from the admin: they are e-mailed a one-time link. */
    async create(actor: Actor, input: CreatePerson): Promise<Person> {
      if (await users.findByEmail(input.email)) {
        throw AppError.conflict('email_taken', `Someone already has the e-mail ${input.email}.`);
      }
      const { now, request } = splitRoles([], input.roles);
      let user: User;
      try {
        user = await users.create({
          email: input.email,
          displayName: input.displayName,
          roles: now,
          passwordHash: noPasswordYet,
        });
      } catch (error) {
        if (isDuplicateKey(error)) {
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
      const pending = request ? await requestRoles(actor, user, request) : null;
      await passwordLinks.send(user, 'new-account', actor.id);
      await audit.append({
        actorUserId: actor.id,
        action: 'person.password-link-sent',
        entityType: 'user',
        entityId: user.id,
        ipAddress: actor.ipAddress,
        details: { purpose: 'new-account' },
      });
      return toPerson(user, pending);
    },

    async update(actor: Actor, id: number, changes: UpdatePerson): Promise<Person> {
      const before = await mustFind(id);
      if (
        actor.id === id &&
        changes.roles &&
        !changes.roles.includes('admin') &&
        before.roles.includes('admin')
      ) {
        throw AppError.conflict(
          'own_admin_role',
          'You cannot remove your own administrator role; ask another administrator.',
        );
      }
      if (actor.id === id && changes.active === false) {
        throw AppError.conflict(
          'own_account',
          'You cannot deactivate your own account; ask another administrator.',
        );
      }
      const split = changes.roles ? splitRoles(before.roles, changes.roles) : null;
      if (actor.id === id && split?.request) {
        throw AppError.conflict(
          'own_clinical_role',
          'You cannot give yourself a clinical role; another administrator must ask for it and a third approve it.',
        );
      }
      const after = await users.update(id, { ...changes, ...(split ? { roles: split.now } : {}) });
      if (!after) throw AppError.notFound(`No person has the id ${id}.`);
      const changed: Record<string, { from: unknown; to: unknown }> = {};
      for (const key of ['displayName', 'roles', 'active'] as const) {
        if (
          changes[key] !== undefined &&
          JSON.stringify(before[key]) !== JSON.stringify(after[key])
        ) {
          changed[key] = { from: before[key], to: after[key] };
        }
      }
      if (Object.keys(changed).length > 0) {
        const action = changed.active
          ? after.active
            ? 'person.reactivated'
            : 'person.deactivated'
          : 'person.updated';
        await audit.append({
          actorUserId: actor.id,
          action,
          entityType: 'user',
          entityId: id,
          ipAddress: actor.ipAddress,
          details: { changed },
        });
      }
      if (changed.active && !after.active) await signInSessions.revokeAllOf(id, 'deactivated');
      const pending = split?.request
        ? await requestRoles(actor, after, split.request)
        : await roleRequests.pendingFor(id);
      return toPerson(after, pending);
    },

    async pendingRoleRequests(): Promise<RoleRequestView[]> {
      const pending = await roleRequests.pending();
      const people = new Map((await users.list()).map((u) => [u.id, u]));
      return pending.map((r) => ({
        id: r.id,
        userId: r.userId,
        personName: people.get(r.userId)?.displayName ?? `#${r.userId}`,
        currentRoles: people.get(r.userId)?.roles ?? [],
        roles: r.roles,
        requestedBy: r.requestedBy,
        requestedByName: people.get(r.requestedBy)?.displayName ?? `#${r.requestedBy}`,
        requestedAt: r.requestedAt.toISOString(),
      }));
    },

    /** A second administrator approves or rejects; never the one who asked, nor the person concerned. */
    async decideRoleRequest(
      actor: Actor,
      requestId: number,
      decision: 'approved' | 'rejected',
    ): Promise<Person> {
      const request = await roleRequests.findById(requestId);
      if (!request) throw AppError.notFound(`No role request has the id ${requestId}.`);
      if (request.status !== 'pending')
        throw AppError.conflict(
          'request_decided',
          `Role request ${requestId} is already ${request.status}.`,
        );
      if (request.requestedBy === actor.id) {
        throw new AppError(
          403,
          'own_request',
          'You asked for this change; a different administrator must decide it.',
        );
      }
      if (request.userId === actor.id) {
        throw new AppError(
          403,
          'own_roles',
          'This change is to your own roles; a different administrator must decide it.',
        );
      }
      const before = await mustFind(request.userId);
      await unitOfWork(async (tx) => {
        if (!(await roleRequests.decide(tx, requestId, decision, actor.id))) {
          throw AppError.conflict(
            'request_decided',
            `Role request ${requestId} was decided by someone else just now.`,
          );
        }
        if (decision === 'approved') await users.setRoles(tx, request.userId, request.roles);
      });
      await audit.append({
        actorUserId: actor.id,
        action:
          decision === 'approved' ? 'person.role-change-approved' : 'person.role-change-rejected',
        entityType: 'user',
        entityId: request.userId,
        ipAddress: actor.ipAddress,
        details: {
          requestId,
          requestedBy: request.requestedBy,
          from: before.roles,
          to: request.roles,
        },
      });
      return toPerson(await mustFind(request.userId));
    },

    /** An admin's reset: a one-time link by e-mail. The admin is told only that it was sent. */
    async sendPasswordLink(actor: Actor, id: number): Promise<void> {
      const user = await mustFind(id);
      if (!user.active)
        throw AppError.conflict(
          'person_inactive',
          `${user.displayName} is deactivated; reactivate them before sending a link.`,
        );
      await passwordLinks.send(
        user,
        user.passwordChangedAt === null ? 'new-account' : 'reset',
        actor.id,
      );
      await audit.append({
        actorUserId: actor.id,
        action: 'person.password-link-sent',
        entityType: 'user',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: { purpose: user.passwordChangedAt === null ? 'new-account' : 'reset' },
      });
    },

    /** Signs the person out everywhere, at once. */
    async endSessions(actor: Actor, id: number): Promise<{ ended: number }> {
      await mustFind(id);
      const ended = await signInSessions.revokeAllOf(id, 'ended-by-admin');
      await audit.append({
        actorUserId: actor.id,
        action: 'person.sessions-ended',
        entityType: 'user',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: { ended },
      });
      return { ended };
    },
  };
}

export type PeopleService = ReturnType<typeof createPeopleService>;
