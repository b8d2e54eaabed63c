import { statSync, unlinkSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { verifyAuditChain } from '../../server/audit/repository';
import type { Config } from '../../server/config';
import { appDataSource } from '../../server/db/options';
import {
  createTestPerson,
  signedInAgent,
  startTestApp,
  testConfig,
  type TestContext,
} from '../support/api';
import { freshTestDatabase, runCommand } from '../support/database';

// `npm run backup` and `npm run restore`, run as a person would, on databases of the test's own.
let config: Config;
let ctx: TestContext;

beforeAll(async () => {
  config = await freshTestDatabase('backup');
  ctx = await startTestApp({ DB_NAME: config.DB_NAME });
});
afterAll(async () => {
  await ctx?.close();
});

const patientBody = (recordNumber: string, familyName: string) => ({
  recordNumber,
  givenName: 'Maren',
  familyName,
  dateOfBirth: '1951-03-09',
  email: null,
  emailConsent: false,
});

async function snapshot(dbName: string) {
  const source = appDataSource(testConfig({ DB_NAME: dbName }));
  await source.initialize();
  try {
    const patients = await source.query(
      'SELECT record_number AS recordNumber, family_name AS familyName FROM patient ORDER BY id',
    );
    const audit = await source.query('SELECT id, action, hash FROM audit_event ORDER BY id');
    return { patients, audit, chain: await verifyAuditChain(source) };
  } finally {
    await source.destroy();
  }
}

describe('a backup', () => {
  it('is written with mode 0600, and restores into a fresh database with the data and the audit chain as they were', async () => {
    const clinician = await signedInAgent(ctx, await createTestPerson(ctx, ['clinician']));
    expect(
      (await clinician.post('/api/patients').send(patientBody('BK-0001', 'Before'))).status,
    ).toBe(201);
    const atBackup = await snapshot(config.DB_NAME);
    expect(atBackup.chain.ok).toBe(true);

    const backup = runCommand('server/ops/backup.ts', ['--database', config.DB_NAME]);
    expect(backup.code, backup.out).toBe(0);
    const file = backup.out.trim().split('\n').at(-1)!;
    expect(path.dirname(file)).toMatch(/\.data\/backups$/);
    expect(statSync(file).mode & 0o777).toBe(0o600);
    expect(statSync(path.dirname(file)).mode & 0o777).toBe(0o700);

    // Life goes on after the backup: a new patient, another audit row.
    expect(
      (await clinician.post('/api/patients').send(patientBody('BK-0002', 'After'))).status,
    ).toBe(201);
    const changed = await snapshot(config.DB_NAME);
    expect(changed.patients).toHaveLength(atBackup.patients.length + 1);

    // Over a database that holds tables: refused without --force, and nothing changes.
    const refused = runCommand('server/ops/restore.ts', [file, '--database', config.DB_NAME]);
    expect(refused.code).toBe(1);
    expect(refused.out).toMatch(/is not empty .*nothing was changed/);
    expect(await snapshot(config.DB_NAME)).toEqual(changed);

    const fresh = `${config.DB_NAME}_restored`;
    const restore = runCommand('server/ops/restore.ts', [file, '--database', fresh, '--force']);
    expect(restore.code, restore.out).toBe(0);
    expect(restore.out).toContain('the audit trail is intact');
    // Read as the app's own user: the restore gave it its rights again.
    const restored = await snapshot(fresh);
    expect(restored).toEqual(atBackup);
    expect(runCommand('server/ops/audit-verify.ts', ['--database', fresh]).code).toBe(0);
    unlinkSync(file);
  });
});
