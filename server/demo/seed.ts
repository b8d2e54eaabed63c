import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import { createAuditRepository } from '../audit/repository';
import { createUserRepository } from '../people/repository';
import { passwordHashCost } from '../people/service';

export const demoPassword = 'luxtempo-demo';
export const demoDomain = 'demo.luxtempo.example';

/** The staff of the fictitious Marram Point Eye Unit. Names are invented. */
export const demoPeople: { email: string; displayName: string; roles: Role[] }[] = [
  { email: `clinician@${demoDomain}`, displayName: 'Dr Wren Halloway (demo)', roles: ['clinician'] },
  { email: `nurse@${demoDomain}`, displayName: 'Juno Pettigrew (demo)', roles: ['nurse'] },
  { email: `pharmacist@${demoDomain}`, displayName: 'Osric Vantongeren (demo)', roles: ['pharmacist'] },
  { email: `auditor@${demoDomain}`, displayName: 'Marisol Quenby (demo)', roles: ['auditor'] },
  { email: `admin@${demoDomain}`, displayName: 'Fenwick Arbuthnot (demo)', roles: ['admin'] },
  // A small unit's charge nurse also runs the people list.
  { email: `charge-nurse@${demoDomain}`, displayName: 'Tamsin Oakenfold (demo)', roles: ['nurse', 'admin'] },
];

/** Adds the demo people that are missing; leaves anyone already there as they are. */
export async function seedDemoData(dataSource: DataSource): Promise<{ created: string[] }> {
  const users = createUserRepository(dataSource);
  const audit = createAuditRepository(dataSource);
  const created: string[] = [];
  for (const person of demoPeople) {
    if (await users.findByEmail(person.email)) continue;
    const user = await users.create({ ...person, passwordHash: await bcrypt.hash(demoPassword, passwordHashCost) });
    await audit.append({ actorUserId: null, action: 'person.created', entityType: 'user', entityId: user.id, details: { email: user.email, roles: user.roles, by: 'demo seed' } });
    created.push(person.email);
  }
  return { created };
}
