import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import { createAuditRepository } from '../audit/repository';
import { createPatientRepository } from '../patients/repository';
import { createUserRepository } from '../people/repository';
import { hashPassword } from '../auth/passwords';

export const demoPassword = 'luxtempo-demo';
export const demoDomain = 'demo.luxtempo.example';

/** The staff of the fictitious Marram Point Eye Unit. Names are invented. */
export const demoPeople: { email: string; displayName: string; roles: Role[] }[] = [
  {
    email: `clinician@${demoDomain}`,
    displayName: 'Dr Wren Halloway (demo)',
    roles: ['clinician'],
  },
  { email: `nurse@${demoDomain}`, displayName: 'Juno Pettigrew (demo)', roles: ['nurse'] },
  {
    email: `pharmacist@${demoDomain}`,
    displayName: 'Osric Vantongeren (demo)',
    roles: ['pharmacist'],
  },
  { email: `auditor@${demoDomain}`, displayName: 'Marisol Quenby (demo)', roles: ['auditor'] },
  { email: `admin@${demoDomain}`, displayName: 'Fenwick Arbuthnot (demo)', roles: ['admin'] },
  // A small unit's charge nurse also runs the people list.
  {
    email: `charge-nurse@${demoDomain}`,
    displayName: 'Tamsin Oakenfold (demo)',
    roles: ['nurse', 'admin'],
  },
];

/**
 * Invented patients of the demo unit: names are made up and obviously so (no real people).
 * Heights and weights are plausible adults; some are recorded in pounds and inches, as a
 * referral letter might give them.
 */
export const demoPatients = [
  {
    recordNumber: 'MP-100201',
    givenName: 'Aurelio',
    familyName: 'Quintavalle',
    dateOfBirth: '1948-03-14',
    email: 'aurelio.q@patients.demo.luxtempo.example',
    emailConsent: true,
    heightCm: 172,
    weightKg: 78,
  },
  {
    recordNumber: 'MP-100202',
    givenName: 'Berenice',
    familyName: 'Oakhollow',
    dateOfBirth: '1952-11-02',
    email: null,
    emailConsent: false,
    heightCm: 160,
    weightKg: 61,
  },
  {
    recordNumber: 'MP-100203',
    givenName: 'Casimir',
    familyName: 'Brightwater',
    dateOfBirth: '1961-07-21',
    email: 'c.brightwater@patients.demo.luxtempo.example',
    emailConsent: true,
    heightCm: 183,
    weightKg: 92,
  },
  {
    recordNumber: 'MP-100204',
    givenName: 'Delphine',
    familyName: 'Marchbank',
    dateOfBirth: '1944-01-30',
    email: null,
    emailConsent: false,
    heightCm: 155,
    weightKg: 52,
  },
  {
    recordNumber: 'MP-100205',
    givenName: 'Evander',
    familyName: 'Tidewell',
    dateOfBirth: '1970-05-09',
    email: 'evander.t@patients.demo.luxtempo.example',
    emailConsent: false,
    heightCm: 178,
    weightKg: 84,
  },
  {
    recordNumber: 'MP-100206',
    givenName: 'Fenella',
    familyName: 'Gorsemoor',
    dateOfBirth: '1958-09-17',
    email: 'fenella.g@patients.demo.luxtempo.example',
    emailConsent: true,
    heightCm: 166,
    weightKg: 70,
  },
  {
    recordNumber: 'MP-100207',
    givenName: 'Gideon',
    familyName: 'Saltmarsh',
    dateOfBirth: '1999-12-03',
    email: 'gideon.s@patients.demo.luxtempo.example',
    emailConsent: true,
    heightCm: 185,
    weightKg: 74,
  },
  {
    recordNumber: 'MP-100208',
    givenName: 'Honora',
    familyName: 'Wickenden',
    dateOfBirth: '2004-06-26',
    email: null,
    emailConsent: false,
    heightCm: 163,
    weightKg: 55,
  },
  {
    recordNumber: 'MP-100209',
    givenName: 'Ignatius',
    familyName: 'Fallowfield',
    dateOfBirth: '1995-02-11',
    email: 'ignatius.f@patients.demo.luxtempo.example',
    emailConsent: true,
    heightCm: 176,
    weightKg: 69,
  },
  {
    recordNumber: 'MP-100210',
    givenName: 'Juniper',
    familyName: 'Cresswick',
    dateOfBirth: '1966-08-08',
    email: null,
    emailConsent: false,
    heightCm: 158,
    weightKg: 104,
  },
  {
    recordNumber: 'MP-100211',
    givenName: 'Leopold',
    familyName: 'Ambervale',
    dateOfBirth: '1950-04-19',
    email: 'leo.ambervale@patients.demo.luxtempo.example',
    emailConsent: true,
    heightCm: 169,
    weightKg: 81,
  },
  {
    recordNumber: 'MP-100212',
    givenName: 'Marguerite',
    familyName: 'Thistlewood',
    dateOfBirth: '2001-10-15',
    email: 'marguerite.t@patients.demo.luxtempo.example',
    emailConsent: true,
    heightCm: 171,
    weightKg: 63,
  },
];

/** Adds the demo people that are missing; leaves anyone already there as they are. */
export async function seedDemoData(dataSource: DataSource): Promise<{ created: string[] }> {
  const users = createUserRepository(dataSource);
  const audit = createAuditRepository(dataSource);
  const created: string[] = [];
  for (const person of demoPeople) {
    if (await users.findByEmail(person.email)) continue;
    const user = await users.create({ ...person, passwordHash: await hashPassword(demoPassword) });
    // The demo password is published; it counts as set, so no link is needed.
    await users.setPassword(user.id, user.passwordHash);
    await audit.append({
      actorUserId: null,
      action: 'person.created',
      entityType: 'user',
      entityId: user.id,
      details: { email: user.email, roles: user.roles, by: 'demo seed' },
    });
    created.push(person.email);
  }
  const patients = createPatientRepository(dataSource);
  for (const { heightCm: _h, weightKg: _w, ...patient } of demoPatients) {
    if (await patients.findByRecordNumber(patient.recordNumber)) continue;
    const saved = await patients.create(patient);
    await audit.append({
      actorUserId: null,
      action: 'patient.created',
      entityType: 'patient',
      entityId: saved.id,
      details: { recordNumber: saved.recordNumber, by: 'demo seed' },
    });
    created.push(patient.recordNumber);
  }
  return { created };
}

/**
 * With demo data off, demo people left from an earlier run are deactivated and their sessions
 * ended: their password is published. Returns how many were still active.
 */
export async function retireDemoPeople(dataSource: DataSource): Promise<number> {
  const emails = demoPeople.map((p) => p.email);
  const result = await dataSource.query(
    'UPDATE user SET active = 0 WHERE active = 1 AND email IN (?)',
    [emails],
  );
  await dataSource.query(
    "UPDATE sign_in_session s JOIN user u ON u.id = s.user_id SET s.revoked_at = NOW(3), s.revoked_reason = 'demo-data-off' WHERE s.revoked_at IS NULL AND u.email IN (?)",
    [emails],
  );
  return Number(result?.affectedRows ?? 0);
}
