import mysql from 'mysql2/promise';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DataSource } from 'typeorm';
import { createAuditRepository, verifyAuditChain } from '../../server/audit/repository';
import type { Config } from '../../server/config';
import { migrateDatabase } from '../../server/db/migrate';
import { migrations } from '../../server/db/migration-list';
import { DatabaseIntegrity1796200000000 } from '../../server/db/migrations/1796200000000-DatabaseIntegrity';
import { appDataSource, dataSourceOptions, type OwnerCredentials } from '../../server/db/options';
import { localOwnerCredentials } from '../../server/ops/environment';
import { createTestPerson, signedInAgent, startTestApp, type TestContext } from '../support/api';
import { freshTestDatabase, ownerConnection, runCommand } from '../support/database';

// The audit trail's hash chain, on a database of its own: these tests change rows as the owner.
let config: Config;
let owner: OwnerCredentials;
let ctx: TestContext;

beforeAll(async () => {
  config = await freshTestDatabase('chain');
  owner = localOwnerCredentials();
  ctx = await startTestApp({ DB_NAME: config.DB_NAME });
});
afterAll(async () => {
  await ctx?.close();
});

async function auditIds(): Promise<string[]> {
  const rows: { id: string }[] = await ctx.dataSource.query(
    'SELECT id FROM audit_event ORDER BY id',
  );
  return rows.map((r) => String(r.id));
}

describe('the audit chain', () => {
  it('stays one chain when rows are written at once from two connection pools (as two API processes would)', async () => {
    const second = appDataSource(config);
    await second.initialize();
    try {
      const a = createAuditRepository(ctx.dataSource);
      const b = createAuditRepository(second);
      await Promise.all(
        Array.from({ length: 40 }, (_, i) =>
          (i % 2 ? a : b).append({
            actorUserId: null,
            action: 'test.concurrent',
            entityType: 'test',
            entityId: i,
            details: { i, text: 'ünïcode “quoted” \\ back' },
          }),
        ),
      );
    } finally {
      await second.destroy();
    }
    const report = await verifyAuditChain(ctx.dataSource);
    expect(report).toMatchObject({ ok: true, firstBrokenId: null });
    expect(report.checked).toBe((await auditIds()).length);
    expect(report.checked).toBeGreaterThanOrEqual(40);
  });

  it('names exactly the row an owner changed, in the command (exit 1) and on the API; the admin and the auditor may ask, a nurse may not', async () => {
    const admin = await signedInAgent(ctx, await createTestPerson(ctx, ['admin']));
    for (let i = 0; i < 5; i++)
      await createAuditRepository(ctx.dataSource).append({
        actorUserId: null,
        action: 'test.tamper-target',
        details: { i },
      });
    const ids = await auditIds();
    const target = ids[ids.length - 3]!;
    expect((await admin.get('/api/audit-chain')).body).toMatchObject({ ok: true });
    expect(runCommand('server/ops/audit-verify.ts', ['--database', config.DB_NAME]).code).toBe(0);

    const db = await ownerConnection(config);
    try {
      await db.query("UPDATE audit_event SET details = JSON_SET(details, '$.i', 99) WHERE id = ?", [
        target,
      ]);
    } finally {
      await db.end();
    }
    const report = await verifyAuditChain(ctx.dataSource);
    expect(report).toMatchObject({
      ok: false,
      firstBrokenId: target,
      reason: expect.stringMatching(/changed after it was written/),
    });
    expect(report.checked).toBe(ids.indexOf(target));

    const command = runCommand('server/ops/audit-verify.ts', ['--database', config.DB_NAME]);
    expect(command.code).toBe(1);
    expect(command.out).toContain(`broken at row ${target}:`);
    const api = await admin.get('/api/audit-chain');
    expect(api.status).toBe(200);
    expect(api.body).toMatchObject({ ok: false, firstBrokenId: target });
    const auditor = await signedInAgent(ctx, await createTestPerson(ctx, ['auditor']));
    expect((await auditor.get('/api/audit-chain')).body.firstBrokenId).toBe(target);
    expect(
      (
        await (
          await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']))
        ).get('/api/audit-chain')
      ).status,
    ).toBe(403);

    // A row removed instead: the row after it is named, by its broken link.
    const db2 = await ownerConnection(config);
    try {
      await db2.query("UPDATE audit_event SET details = JSON_SET(details, '$.i', 2) WHERE id = ?", [
        target,
      ]);
      expect((await verifyAuditChain(ctx.dataSource)).ok).toBe(true);
      await db2.query('DELETE FROM audit_event WHERE id = ?', [target]);
    } finally {
      await db2.end();
    }
    const after = ids[ids.indexOf(target) + 1]!;
    expect(await verifyAuditChain(ctx.dataSource)).toMatchObject({
      ok: false,
      firstBrokenId: after,
      reason: expect.stringMatching(/link to the row before/),
    });
  });
});

describe('the migration that starts the chain', () => {
  it('hashes the rows an earlier version wrote, so an upgraded database verifies', async () => {
    const upgraded = await freshTestDatabase('chain_upgrade');
    // Back to the schema as it stood before the chain: the migrations older than the chain's.
    const admin = await mysql.createConnection({
      host: upgraded.DB_HOST,
      port: upgraded.DB_PORT,
      user: owner.user,
      password: owner.password,
    });
    await admin.query(`DROP DATABASE \`${upgraded.DB_NAME}\``);
    await admin.query(
      `CREATE DATABASE \`${upgraded.DB_NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
    );
    await admin.end();
    const earlier = new DataSource({
      ...dataSourceOptions({
        host: upgraded.DB_HOST,
        port: upgraded.DB_PORT,
        database: upgraded.DB_NAME,
        username: owner.user,
        password: owner.password,
      }),
      migrations: migrations.slice(0, migrations.indexOf(DatabaseIntegrity1796200000000)),
    });
    await earlier.initialize();
    try {
      await earlier.runMigrations();
      for (let i = 0; i < 7; i++) {
        await earlier.query(
          'INSERT INTO audit_event (actor_user_id, action, entity_type, entity_id, details) VALUES (NULL, ?, ?, ?, ?)',
          [
            'test.before-chain',
            'test',
            String(i),
            i % 2 ? null : JSON.stringify({ i, note: 'written before the chain' }),
          ],
        );
      }
    } finally {
      await earlier.destroy();
    }
    const later = migrations
      .slice(migrations.indexOf(DatabaseIntegrity1796200000000))
      .map((m) => m.name);
    expect(await migrateDatabase(upgraded, owner)).toEqual(later);
    const source = appDataSource(upgraded);
    await source.initialize();
    try {
      expect(await verifyAuditChain(source)).toEqual({
        ok: true,
        checked: 7,
        firstBrokenId: null,
        reason: null,
      });
      await createAuditRepository(source).append({ actorUserId: null, action: 'test.after-chain' });
      expect(await verifyAuditChain(source)).toMatchObject({ ok: true, checked: 8 });
    } finally {
      await source.destroy();
    }
  });
});
