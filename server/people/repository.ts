import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import { RoleRequest } from '../db/entities/role-request';
import { User } from '../db/entities/user';
import { managerOf, type Transaction } from '../db/unit-of-work';

export function createUserRepository(dataSource: DataSource) {
  const repo = dataSource.getRepository(User);
  return {
    findById: (id: number) => repo.findOneBy({ id }),
    findByEmail: (email: string) => repo.findOneBy({ email: email.trim().toLowerCase() }),
    list: () => repo.find({ order: { displayName: 'ASC' } }),
    async create(person: {
      email: string;
      displayName: string;
      roles: Role[];
      passwordHash: string;
    }): Promise<User> {
      const created = repo.create({
        ...person,
        email: person.email.trim().toLowerCase(),
        active: true,
      });
      return repo.save(created);
    },
    async update(
      id: number,
      changes: Partial<Pick<User, 'displayName' | 'roles' | 'active' | 'passwordHash'>>,
    ): Promise<User | null> {
      await repo.update({ id }, changes);
      return repo.findOneBy({ id });
    },
    /** A password the person has just set (or one rehashed in the current format). */
    async setPassword(id: number, passwordHash: string, tx?: Transaction): Promise<void> {
      await (managerOf(tx) ?? dataSource.manager).query(
        'UPDATE user SET password_hash = ?, password_changed_at = NOW(3) WHERE id = ?',
        [passwordHash, id],
      );
    },
    /** Everyone's id, name, roles and whether they are active; nothing else (no e-mail). */
    staff: (): Promise<{ id: number; displayName: string; roles: string; active: number }[]> =>
      dataSource.query(
        'SELECT id, display_name AS displayName, roles, active FROM user ORDER BY display_name',
      ),
    /** Roles a second administrator approved, written in the deciding transaction. */
    async setRoles(tx: Transaction, id: number, roles: readonly Role[]): Promise<void> {
      await managerOf(tx).query('UPDATE user SET roles = ? WHERE id = ?', [roles.join(','), id]);
    },
    async rehashPassword(id: number, previousHash: string, passwordHash: string): Promise<void> {
      // Only if nobody changed it meanwhile.
      await dataSource.query(
        'UPDATE user SET password_hash = ? WHERE id = ? AND password_hash = ?',
        [passwordHash, id, previousHash],
      );
    },
  };
}

export type UserRepository = ReturnType<typeof createUserRepository>;

/** Pending and decided role changes that give a clinical role. */
export function createRoleRequestRepository(dataSource: DataSource) {
  const repo = dataSource.getRepository(RoleRequest);
  return {
    findById: (id: number) => repo.findOneBy({ id }),
    pending: () => repo.find({ where: { status: 'pending' }, order: { id: 'ASC' } }),
    pendingFor: (userId: number) => repo.findOneBy({ userId, status: 'pending' }),
    /** A new request for a person replaces the one still waiting. */
    async create(request: {
      userId: number;
      roles: Role[];
      requestedBy: number;
    }): Promise<RoleRequest> {
      await dataSource.query(
        "UPDATE role_request SET status = 'withdrawn', decided_by = ?, decided_at = NOW(3) WHERE user_id = ? AND status = 'pending'",
        [request.requestedBy, request.userId],
      );
      return repo.save(repo.create({ ...request, status: 'pending' }));
    },
    /** Decides a request still pending; false when someone else decided it first. */
    async decide(
      tx: Transaction,
      id: number,
      status: 'approved' | 'rejected',
      decidedBy: number,
    ): Promise<boolean> {
      const result = await managerOf(tx).query(
        "UPDATE role_request SET status = ?, decided_by = ?, decided_at = NOW(3) WHERE id = ? AND status = 'pending'",
        [status, decidedBy, id],
      );
      return Number(result?.affectedRows ?? 0) === 1;
    },
  };
}

export type RoleRequestRepository = ReturnType<typeof createRoleRequestRepository>;
