import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import { User } from '../db/entities/user';

export function createUserRepository(dataSource: DataSource) {
  const repo = dataSource.getRepository(User);
  return {
    findById: (id: number) => repo.findOneBy({ id }),
    /** What every authenticated request reads: one plain indexed row, without entity machinery. */
    async findSessionUser(id: number): Promise<Pick<User, 'id' | 'email' | 'displayName' | 'roles' | 'active'> | null> {
      const [row] = await dataSource.query('SELECT id, email, display_name AS displayName, roles, active FROM user WHERE id = ?', [id]);
      if (!row) return null;
      return { id: row.id, email: row.email, displayName: row.displayName, roles: row.roles ? String(row.roles).split(',') as Role[] : [], active: Boolean(row.active) };
    },
    findByEmail: (email: string) => repo.findOneBy({ email: email.trim().toLowerCase() }),
    list: () => repo.find({ order: { displayName: 'ASC' } }),
    async create(person: { email: string; displayName: string; roles: Role[]; passwordHash: string }): Promise<User> {
      const created = repo.create({ ...person, email: person.email.trim().toLowerCase(), active: true });
      return repo.save(created);
    },
    async update(id: number, changes: Partial<Pick<User, 'displayName' | 'roles' | 'active' | 'passwordHash'>>): Promise<User | null> {
      await repo.update({ id }, changes);
      return repo.findOneBy({ id });
    },
  };
}

export type UserRepository = ReturnType<typeof createUserRepository>;
