import { randomUUID } from 'node:crypto';
import { createServer } from 'node:net';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInCookieName } from '../../server/auth/sign-in-session';
import { demoPassword, demoPeople, retireDemoPeople, seedDemoData } from '../../server/demo/seed';
import { createFirstAdmin } from '../../server/people/first-admin';
import { startApiProcess, type ApiProcess } from '../../server/ops/api-process';
import { dataDir } from '../../server/ops/paths';
import {
  createTestPatient,
  createTestPerson,
  pdtOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';

let ctx: TestContext;
/**
 * Every test signs in from 127.0.0.1, and the failures this file makes on purpose would make that
 * address wait; it starts and leaves the address's count empty, so no other file meets them.
 */
const clearLoopbackCount = () =>
  ctx.dataSource.query("DELETE FROM sign_in_throttle WHERE throttle_key LIKE 'address:%127.0.0.1'");
beforeAll(async () => {
  ctx = await startTestApp();
  await clearLoopbackCount();
});
afterAll(async () => {
  await clearLoopbackCount();
  await ctx.close();
});

type Agent = ReturnType<typeof supertest.agent>;
const newEmail = () => `acct-${randomUUID().slice(0, 8)}@test.luxtempo.example`;
/** A documentation-range address of the test's own, so its failure counts meet no other test's. */
const ownAddress = () => `2001:db8::${randomUUID().slice(0, 4)}`;
const goodPassword = () => `lantern-${randomUUID().slice(0, 12)}-harbour`;

async function userRow(id: number) {
  const [row] = await ctx.dataSource.query(
    'SELECT password_hash AS passwordHash, roles, password_changed_at AS passwordChangedAt FROM user WHERE id = ?',
    [id],
  );
  return row as { passwordHash: string; roles: string; passwordChangedAt: Date | null };
}

async function auditActions(userId: number): Promise<string[]> {
  const rows = await ctx.dataSource.query(
    'SELECT action FROM audit_event WHERE entity_type = ? AND entity_id = ? ORDER BY id',
    ['user', String(userId)],
  );
  return rows.map((r: { action: string }) => r.action);
}

/** The one-time token from the newest link e-mail to this address, as the person would read it. */
async function tokenMailedTo(email: string): Promise<string> {
  const [row] = await ctx.dataSource.query(
    "SELECT body FROM outbox_message WHERE kind = 'password-link' AND JSON_CONTAINS(recipients, JSON_QUOTE(?)) ORDER BY id DESC LIMIT 1",
    [email],
  );
  const match = /\/set-password#([A-Za-z0-9_-]{43})/.exec(row?.body ?? '');
  if (!match) throw new Error(`no link mailed to ${email}`);
  return match[1]!;
}

async function adminAgent(): Promise<[Agent, TestPerson]> {
  const admin = await createTestPerson(ctx, ['admin']);
  return [await signedInAgent(ctx, admin), admin];
}

/** An admin adds a person (no clinical role) who sets their password through the mailed link. */
async function personWithOwnPassword(password = goodPassword()) {
  const [admin] = await adminAgent();
  const email = newEmail();
  const created = await admin
    .post('/api/people')
    .send({ email, displayName: 'Link Person', roles: ['nurse'] });
  expect(created.status).toBe(201);
  const set = await supertest(ctx.app)
    .post('/api/auth/password-link')
    .send({ token: await tokenMailedTo(email), password });
  expect(set.status).toBe(204);
  return { id: created.body.person.id as number, email, password };
}

describe('one-time links to set a password', () => {
  it('a new person gets a link by e-mail; the admin is told only that it was sent; the person sets a password and signs in', async () => {
    const [admin] = await adminAgent();
    const email = newEmail();
    const created = await admin
      .post('/api/people')
      .send({ email, displayName: 'Nadia Linkwell', roles: ['nurse'] });
    expect(created.status).toBe(201);
    const token = await tokenMailedTo(email);
    expect(JSON.stringify(created.body)).not.toContain(token);
    expect(created.body.passwordLink).toBe('sent');

    const [stored] = await ctx.dataSource.query(
      'SELECT token_hash FROM password_link WHERE user_id = ?',
      [created.body.person.id],
    );
    expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(stored.token_hash).not.toContain(token);

    const check = await supertest(ctx.app).post('/api/auth/password-link/check').send({ token });
    expect(check.body.link).toMatchObject({
      email,
      displayName: 'Nadia Linkwell',
      purpose: 'new-account',
    });
    const password = goodPassword();
    expect(
      (await supertest(ctx.app).post('/api/auth/password-link').send({ token, password })).status,
    ).toBe(204);
    expect(
      (await supertest(ctx.app).post('/api/auth/login').send({ email, password })).status,
    ).toBe(200);
    expect(await auditActions(created.body.person.id)).toEqual(
      expect.arrayContaining([
        'person.created',
        'person.password-link-sent',
        'password.set-by-link',
        'sign-in',
      ]),
    );
  });

  it('a link works once: used again it is refused with 410 and the password stays as set', async () => {
    const [admin] = await adminAgent();
    const email = newEmail();
    const created = await admin
      .post('/api/people')
      .send({ email, displayName: 'Once Only', roles: ['auditor'] });
    const token = await tokenMailedTo(email);
    const first = goodPassword();
    expect(
      (await supertest(ctx.app).post('/api/auth/password-link').send({ token, password: first }))
        .status,
    ).toBe(204);
    const hashAfterFirst = (await userRow(created.body.person.id)).passwordHash;
    const again = await supertest(ctx.app)
      .post('/api/auth/password-link')
      .send({ token, password: goodPassword() });
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('link_not_valid');
    expect((await userRow(created.body.person.id)).passwordHash).toBe(hashAfterFirst);
    expect(
      (await supertest(ctx.app).post('/api/auth/login').send({ email, password: first })).status,
    ).toBe(200);
  });

  it('an expired link is refused with 410 and stores nothing', async () => {
    const [admin] = await adminAgent();
    const email = newEmail();
    const created = await admin
      .post('/api/people')
      .send({ email, displayName: 'Too Late', roles: ['nurse'] });
    const token = await tokenMailedTo(email);
    await ctx.dataSource.query(
      'UPDATE password_link SET expires_at = NOW(3) - INTERVAL 1 SECOND WHERE user_id = ?',
      [created.body.person.id],
    );
    expect(
      (await supertest(ctx.app).post('/api/auth/password-link/check').send({ token })).status,
    ).toBe(410);
    const res = await supertest(ctx.app)
      .post('/api/auth/password-link')
      .send({ token, password: goodPassword() });
    expect(res.status).toBe(410);
    const row = await userRow(created.body.person.id);
    expect(row.passwordChangedAt).toBeNull();
    const [link] = await ctx.dataSource.query(
      'SELECT used_at FROM password_link WHERE user_id = ?',
      [created.body.person.id],
    );
    expect(link.used_at).toBeNull();
  });

  it('an admin reset sends a new link that replaces the old one; the admin sees "sent", never the link; the person’s sessions end when it is used', async () => {
    const person = await personWithOwnPassword();
    const [admin] = await adminAgent();
    const personAgent = supertest.agent(ctx.app);
    expect(
      (
        await personAgent
          .post('/api/auth/login')
          .send({ email: person.email, password: person.password })
      ).status,
    ).toBe(200);
    const older = await tokenMailedTo(person.email);
    const reset = await admin.post(`/api/people/${person.id}/password-link`).send({});
    expect(reset.status).toBe(202);
    expect(reset.body).toEqual({ passwordLink: 'sent' });
    const token = await tokenMailedTo(person.email);
    expect(token).not.toBe(older);
    expect(
      (await supertest(ctx.app).post('/api/auth/password-link/check').send({ token: older }))
        .status,
    ).toBe(410);
    const outbox = await admin.get('/api/outbox');
    expect(JSON.stringify(outbox.body)).not.toContain(token);
    const fresh = goodPassword();
    expect(
      (await supertest(ctx.app).post('/api/auth/password-link').send({ token, password: fresh }))
        .status,
    ).toBe(204);
    expect((await personAgent.get('/api/auth/me')).status).toBe(401);
  });

  it('a link with a malformed token is a 400 naming the field', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/password-link')
      .send({ token: 'abc', password: goodPassword() });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['token']);
  });
});

describe('the password rules', () => {
  async function refusedThroughLink(password: string) {
    const [admin] = await adminAgent();
    const email = newEmail();
    const created = await admin
      .post('/api/people')
      .send({ email, displayName: 'Rule Tester', roles: ['nurse'] });
    const token = await tokenMailedTo(email);
    const res = await supertest(ctx.app).post('/api/auth/password-link').send({ token, password });
    // Nothing stored: no password, and the link still unused for a better try.
    expect((await userRow(created.body.person.id)).passwordChangedAt).toBeNull();
    const [link] = await ctx.dataSource.query(
      'SELECT used_at FROM password_link WHERE user_id = ?',
      [created.body.person.id],
    );
    expect(link.used_at).toBeNull();
    return res;
  }

  it('refuses a password shorter than 12 characters, naming the field', async () => {
    const res = await refusedThroughLink('short-pw-11');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      expect.objectContaining({ path: 'password', message: expect.stringMatching(/at least 12/) }),
    ]);
  });

  it('refuses a password on the common-passwords list, in any capitals', async () => {
    for (const common of ['qwertyuiopasdfgh', 'PasswordPassword']) {
      const res = await refusedThroughLink(common);
      expect(res.status).toBe(400);
      expect(res.body.error.fields[0].message).toMatch(/commonly used/);
    }
  });

  it('counts every byte of a 100-byte password: another sharing its first 72 bytes does not sign in', async () => {
    const head = `${randomUUID()}${randomUUID()}`.slice(0, 72);
    const password = `${head}${'a'.repeat(28)}`;
    const lookalike = `${head}${'b'.repeat(28)}`;
    expect(Buffer.byteLength(password)).toBe(100);
    const person = await personWithOwnPassword(password);
    expect(
      (
        await supertest(ctx.app)
          .post('/api/auth/login')
          .send({ email: person.email, password: lookalike })
      ).status,
    ).toBe(401);
    expect(
      (await supertest(ctx.app).post('/api/auth/login').send({ email: person.email, password }))
        .status,
    ).toBe(200);
  });

  it('an older plain-bcrypt hash still signs in, and is rewritten in the current format', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    await ctx.dataSource.query('UPDATE user SET password_hash = ? WHERE id = ?', [
      await bcrypt.hash(person.password, 4),
      person.id,
    ]);
    expect(
      (
        await supertest(ctx.app)
          .post('/api/auth/login')
          .send({ email: person.email, password: person.password })
      ).status,
    ).toBe(200);
    expect((await userRow(person.id)).passwordHash).toMatch(/^sha256-bcrypt\$\$2[aby]\$/);
    expect(
      (
        await supertest(ctx.app)
          .post('/api/auth/login')
          .send({ email: person.email, password: person.password })
      ).status,
    ).toBe(200);
  });
});

describe('changing one’s own password', () => {
  it('needs the current password: a wrong one changes nothing and ends no session', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const here = await signedInAgent(ctx, person);
    const elsewhere = await signedInAgent(ctx, person);
    const before = (await userRow(person.id)).passwordHash;
    const res = await here
      .post('/api/auth/password')
      .send({ currentPassword: 'not-my-password', newPassword: goodPassword() });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([expect.objectContaining({ path: 'currentPassword' })]);
    expect((await userRow(person.id)).passwordHash).toBe(before);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(200);
  });

  it('with the current password: the new one works, the old one not, every other session ends and this one goes on', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const here = await signedInAgent(ctx, person);
    const elsewhere = await signedInAgent(ctx, person);
    const next = goodPassword();
    expect(
      (
        await here
          .post('/api/auth/password')
          .send({ currentPassword: person.password, newPassword: next })
      ).status,
    ).toBe(204);
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401);
    expect(
      (
        await supertest(ctx.app)
          .post('/api/auth/login')
          .send({ email: person.email, password: person.password })
      ).status,
    ).toBe(401);
    expect(
      (
        await supertest(ctx.app)
          .post('/api/auth/login')
          .send({ email: person.email, password: next })
      ).status,
    ).toBe(200);
    expect(await auditActions(person.id)).toContain('password.changed');
  });

  it('refuses a short or common new password, keeping the old one', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const here = await signedInAgent(ctx, person);
    const before = (await userRow(person.id)).passwordHash;
    for (const newPassword of ['too-short', '000000000000']) {
      const res = await here
        .post('/api/auth/password')
        .send({ currentPassword: person.password, newPassword });
      expect(res.status).toBe(400);
      expect(res.body.error.fields[0].path).toBe('newPassword');
    }
    expect((await userRow(person.id)).passwordHash).toBe(before);
  });
});

describe('clinical roles need a second administrator', () => {
  it('an admin cannot give themselves the clinician role; nothing is stored', async () => {
    const [agent, admin] = await adminAgent();
    const res = await agent
      .patch(`/api/people/${admin.id}`)
      .send({ roles: ['admin', 'clinician'] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('own_clinical_role');
    expect((await userRow(admin.id)).roles).toBe('admin');
    expect(
      await ctx.dataSource.query('SELECT id FROM role_request WHERE user_id = ?', [admin.id]),
    ).toEqual([]);
  });

  it('a role change to clinician waits for a different admin; the asker and the person cannot approve it; a second admin can, and it is audited', async () => {
    const [first, firstAdmin] = await adminAgent();
    const [second, secondAdmin] = await adminAgent();
    const target = await createTestPerson(ctx, ['nurse', 'admin']);
    const targetAgent = await signedInAgent(ctx, target);

    const asked = await first
      .patch(`/api/people/${target.id}`)
      .send({ roles: ['clinician', 'admin'] });
    expect(asked.status).toBe(200);
    expect(asked.body.person.roles).toEqual(['admin']);
    expect(asked.body.person.pendingRoleRequest).toMatchObject({
      roles: ['clinician', 'admin'],
      requestedBy: firstAdmin.id,
    });
    expect((await targetAgent.get('/api/auth/me')).body.roles).not.toContain('clinician');
    const requestId = asked.body.person.pendingRoleRequest.id;

    const byAsker = await first.post(`/api/role-requests/${requestId}/approval`).send({});
    expect(byAsker.status).toBe(403);
    expect(byAsker.body.error.code).toBe('own_request');
    const byPerson = await targetAgent.post(`/api/role-requests/${requestId}/approval`).send({});
    expect(byPerson.status).toBe(403);
    expect(byPerson.body.error.code).toBe('own_roles');
    expect((await userRow(target.id)).roles).toBe('admin');

    const listed = await second.get('/api/role-requests');
    expect(listed.body.requests.map((r: { id: number }) => r.id)).toContain(requestId);
    const approved = await second.post(`/api/role-requests/${requestId}/approval`).send({});
    expect(approved.status).toBe(200);
    expect(approved.body.person.roles).toEqual(['clinician', 'admin']);
    expect((await targetAgent.get('/api/auth/me')).body.roles).toEqual(['clinician', 'admin']);
    expect((await second.post(`/api/role-requests/${requestId}/approval`).send({})).status).toBe(
      409,
    );

    const [row] = await ctx.dataSource.query(
      "SELECT actor_user_id AS actor, details FROM audit_event WHERE action = 'person.role-change-approved' AND entity_id = ?",
      [String(target.id)],
    );
    expect(row.actor).toBe(secondAdmin.id);
    expect(row.details).toMatchObject({
      requestId,
      requestedBy: firstAdmin.id,
      to: ['clinician', 'admin'],
    });
    expect(await auditActions(target.id)).toEqual(
      expect.arrayContaining(['person.role-change-requested', 'person.role-change-approved']),
    );
  });

  it('a new account asked for as pharmacist starts with no clinical role until a second admin approves', async () => {
    const [first] = await adminAgent();
    const [second] = await adminAgent();
    const created = await first
      .post('/api/people')
      .send({ email: newEmail(), displayName: 'Pending Pharmacist', roles: ['pharmacist'] });
    expect(created.status).toBe(201);
    expect(created.body.person.roles).toEqual([]);
    const requestId = created.body.person.pendingRoleRequest.id;
    const rejected = await second.post(`/api/role-requests/${requestId}/rejection`).send({});
    expect(rejected.status).toBe(200);
    expect(rejected.body.person.roles).toEqual([]);
  });
});

describe('with demo data off', () => {
  it('demo people left from an earlier run can no longer sign in, and their sessions end', async () => {
    await seedDemoData(ctx.dataSource);
    const nurse = demoPeople.find((p) => p.roles.includes('nurse'))!;
    await ctx.dataSource.query('UPDATE user SET active = 1 WHERE email = ?', [nurse.email]);
    const agent = supertest.agent(ctx.app);
    expect(
      (await agent.post('/api/auth/login').send({ email: nurse.email, password: demoPassword }))
        .status,
    ).toBe(200);
    try {
      expect(await retireDemoPeople(ctx.dataSource)).toBeGreaterThan(0);
      expect((await agent.get('/api/auth/me')).status).toBe(401);
      expect(
        (
          await supertest(ctx.app)
            .post('/api/auth/login')
            .send({ email: nurse.email, password: demoPassword })
        ).status,
      ).toBe(401);
    } finally {
      // Other files' tests load the demo people as they were.
      await ctx.dataSource.query('UPDATE user SET active = 1 WHERE email IN (?)', [
        demoPeople.map((p) => p.email),
      ]);
    }
  });

  it('the command for the first administrator makes an admin with no known password and no clinical role, and a link that works once', async () => {
    const email = newEmail();
    const { url, created } = await createFirstAdmin(ctx.dataSource, ctx.config, {
      email,
      displayName: 'First Admin',
    });
    expect(created).toBe(true);
    const [row] = await ctx.dataSource.query(
      'SELECT id, roles, password_hash AS passwordHash, password_changed_at AS changed FROM user WHERE email = ?',
      [email],
    );
    expect(row).toMatchObject({ roles: 'admin', passwordHash: '!unset', changed: null });
    const token = /#([A-Za-z0-9_-]{43})$/.exec(url)![1]!;
    const password = goodPassword();
    expect(
      (await supertest(ctx.app).post('/api/auth/password-link').send({ token, password })).status,
    ).toBe(204);
    expect(
      (await supertest(ctx.app).post('/api/auth/password-link').send({ token, password })).status,
    ).toBe(410);
    const login = await supertest(ctx.app).post('/api/auth/login').send({ email, password });
    expect(login.status).toBe(200);
    expect(login.body.user.roles).toEqual(['admin']);
    expect(await auditActions(row.id)).toContain('person.created');
  });
});

describe('sessions are kept on the server', () => {
  it('signing out ends that session at once: the same cookie replayed is 401', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const login = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: person.email, password: person.password });
    const cookie = (login.headers['set-cookie'] as unknown as string[])
      .find((c) => c.startsWith(`${signInCookieName}=`))!
      .split(';')[0]!;
    expect((await supertest(ctx.app).get('/api/auth/me').set('Cookie', cookie)).status).toBe(200);
    expect((await supertest(ctx.app).post('/api/auth/logout').set('Cookie', cookie)).status).toBe(
      204,
    );
    expect((await supertest(ctx.app).get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('stores only a hash of the session id', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const login = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: person.email, password: person.password });
    const token = (login.headers['set-cookie'] as unknown as string[])
      .find((c) => c.startsWith(`${signInCookieName}=`))!
      .split(';')[0]!
      .split('=')[1]!;
    const { jti } = JSON.parse(Buffer.from(token.split('.')[1]!, 'base64url').toString());
    const rows = await ctx.dataSource.query(
      'SELECT token_hash FROM sign_in_session WHERE user_id = ?',
      [person.id],
    );
    expect(rows).toHaveLength(1);
    expect(rows[0].token_hash).not.toContain(jti);
  });

  it(`ends a session idle for longer than SESSION_IDLE_MIN, and says why`, async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, person);
    await ctx.dataSource.query(
      'UPDATE sign_in_session SET last_seen_at = NOW(3) - INTERVAL ? MINUTE - INTERVAL 5 SECOND WHERE user_id = ?',
      [ctx.config.SESSION_IDLE_MIN, person.id],
    );
    const res = await agent.get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(/without activity/);
    const [row] = await ctx.dataSource.query(
      'SELECT revoked_reason FROM sign_in_session WHERE user_id = ?',
      [person.id],
    );
    expect(row.revoked_reason).toBe('idle');
  });

  it('a session in use is moved forward at most once a minute', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, person);
    const seen = async () =>
      new Date(
        (
          await ctx.dataSource.query('SELECT last_seen_at FROM sign_in_session WHERE user_id = ?', [
            person.id,
          ])
        )[0].last_seen_at,
      ).getTime();
    const first = await seen();
    await agent.get('/api/auth/me');
    expect(await seen()).toBe(first);
    await ctx.dataSource.query(
      'UPDATE sign_in_session SET last_seen_at = NOW(3) - INTERVAL 2 MINUTE WHERE user_id = ?',
      [person.id],
    );
    const backdated = await seen();
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    expect(await seen()).toBeGreaterThan(backdated + 100_000);
  });

  it('ends a session past its maximum lifetime, however active', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, person);
    await ctx.dataSource.query(
      'UPDATE sign_in_session SET expires_at = NOW(3) - INTERVAL 1 SECOND WHERE user_id = ?',
      [person.id],
    );
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('deactivating a person ends their sessions in the table, not only at the next read', async () => {
    const [admin] = await adminAgent();
    const person = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, person);
    await admin.patch(`/api/people/${person.id}`).send({ active: false });
    await admin.patch(`/api/people/${person.id}`).send({ active: true });
    // Reactivated, but the old session stays ended.
    expect((await agent.get('/api/auth/me')).status).toBe(401);
    const [row] = await ctx.dataSource.query(
      'SELECT revoked_reason FROM sign_in_session WHERE user_id = ?',
      [person.id],
    );
    expect(row.revoked_reason).toBe('deactivated');
  });

  it('the check every call makes is one query on the unique token hash, joined to the person by primary key', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    await signedInAgent(ctx, person);
    const [{ token_hash: tokenHash }] = await ctx.dataSource.query(
      'SELECT token_hash FROM sign_in_session WHERE user_id = ?',
      [person.id],
    );
    const plan: { table: string; type: string; key: string | null }[] = await ctx.dataSource.query(
      `EXPLAIN SELECT s.id, u.id, u.email, u.display_name, u.roles, u.active, TIMESTAMPDIFF(SECOND, s.last_seen_at, NOW(3)), s.expires_at <= NOW(3), s.revoked_at IS NOT NULL
         FROM sign_in_session s JOIN user u ON u.id = s.user_id WHERE s.token_hash = ?`,
      [tokenHash],
    );
    expect(plan.find((row) => row.table === 's')).toMatchObject({
      type: 'const',
      key: 'uq_sign_in_session_token',
    });
    expect(plan.find((row) => row.table === 'u')).toMatchObject({ type: 'const', key: 'PRIMARY' });
  });

  it('a JWT signed with the right secret but naming no stored session is refused', async () => {
    const { default: jwt } = await import('jsonwebtoken');
    const person = await createTestPerson(ctx, ['nurse']);
    const token = jwt.sign({}, ctx.config.JWT_SECRET, {
      subject: String(person.id),
      issuer: 'luxtempo',
      expiresIn: '1h',
      jwtid: randomUUID() + randomUUID(),
    });
    expect(
      (await supertest(ctx.app).get('/api/auth/me').set('Cookie', `${signInCookieName}=${token}`))
        .status,
    ).toBe(401);
  });
});

describe('X-Forwarded-For', () => {
  it('is ignored without TRUST_PROXY: a failure counts against the connecting address, not the one claimed', async () => {
    await clearLoopbackCount();
    const claimed = ownAddress();
    const res = await supertest(ctx.app)
      .post('/api/auth/login')
      .set('X-Forwarded-For', claimed)
      .send({ email: newEmail(), password: 'some-guess-or-other' });
    expect(res.status).toBe(401);
    expect(
      await ctx.dataSource.query('SELECT * FROM sign_in_throttle WHERE throttle_key = ?', [
        `address:${claimed}`,
      ]),
    ).toEqual([]);
    const counted = await ctx.dataSource.query(
      "SELECT failures FROM sign_in_throttle WHERE throttle_key LIKE 'address:%127.0.0.1'",
    );
    expect(counted.map((r: { failures: number }) => Number(r.failures))).toEqual([1]);
  });
});

/** A free loopback port for an API process of this test's own. */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

describe('two API processes on one database', () => {
  const processes: ApiProcess[] = [];
  let portB = 0;
  const start = async (port: number, name: string) =>
    startApiProcess({
      port,
      env: { ...process.env, TRUST_PROXY: 'loopback', NODE_ENV: 'test' },
      logFile: path.join(dataDir, `accounts-test-${name}.log`),
    });
  let a: ApiProcess;
  let b: ApiProcess;

  beforeAll(async () => {
    a = await start(await freePort(), 'a');
    portB = await freePort();
    b = await start(portB, 'b');
    processes.push(a, b);
  }, 90_000);
  afterAll(async () => {
    for (const p of processes) await p.kill();
  });

  async function login(base: string, email: string, password: string, address: string) {
    const res = await fetch(`${base}/api/auth/login`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'X-Forwarded-For': address },
      body: JSON.stringify({ email, password }),
    });
    const cookie = res.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ');
    return { status: res.status, cookie, retryAfter: res.headers.get('retry-after') };
  }
  const me = async (base: string, cookie: string) =>
    (await fetch(`${base}/api/auth/me`, { headers: { Cookie: cookie } })).status;

  it('a cookie signed out on one process is refused when replayed on the other', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const { cookie } = await login(a.url, person.email, person.password, ownAddress());
    expect(await me(b.url, cookie)).toBe(200);
    const out = await fetch(`${a.url}/api/auth/logout`, {
      method: 'POST',
      headers: { Cookie: cookie, Origin: a.url },
    });
    expect(out.status).toBe(204);
    expect(await me(b.url, cookie)).toBe(401);
    expect(await me(a.url, cookie)).toBe(401);
  });

  it('an admin’s "end all sessions" on one process signs the person out on both', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const admin = await createTestPerson(ctx, ['admin']);
    const onA = await login(a.url, person.email, person.password, ownAddress());
    const onB = await login(b.url, person.email, person.password, ownAddress());
    expect(await me(a.url, onB.cookie)).toBe(200);
    const adminSession = await login(b.url, admin.email, admin.password, ownAddress());
    const ended = await fetch(`${b.url}/api/people/${person.id}/sessions/end`, {
      method: 'POST',
      headers: { Cookie: adminSession.cookie, Origin: b.url },
    });
    expect(ended.status).toBe(200);
    expect(await ended.json()).toEqual({ ended: 2 });
    for (const cookie of [onA.cookie, onB.cookie]) {
      expect(await me(a.url, cookie)).toBe(401);
      expect(await me(b.url, cookie)).toBe(401);
    }
  });

  it('failures on one process hold on the other and after a restart; after the wait the right password works', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const address = ownAddress();
    for (let i = 1; i <= ctx.config.LOGIN_FAILURE_LIMIT; i++) {
      expect((await login(a.url, person.email, `wrong-guess-${i}`, address)).status).toBe(401);
    }
    // The right password, from another address, on the other process: the account waits.
    const onB = await login(b.url, person.email, person.password, ownAddress());
    expect(onB.status).toBe(429);
    expect(Number(onB.retryAfter)).toBeGreaterThan(0);
    expect(onB.cookie).not.toContain(signInCookieName);
    expect(
      await ctx.dataSource.query('SELECT id FROM sign_in_session WHERE user_id = ?', [person.id]),
    ).toEqual([]);

    await b.kill();
    b = await start(portB, 'b-restarted');
    processes.push(b);
    expect((await login(b.url, person.email, person.password, ownAddress())).status).toBe(429);

    // The wait passes (moved on in the table rather than slept through): the owner gets in.
    await ctx.dataSource.query(
      'UPDATE sign_in_throttle SET wait_until = NOW(3) - INTERVAL 1 SECOND WHERE throttle_key = ?',
      [`account:${person.email}`],
    );
    expect((await login(b.url, person.email, person.password, ownAddress())).status).toBe(200);
  }, 90_000);

  it('each failure past the limit doubles the wait', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const key = `account:${person.email}`;
    const waitS = async () =>
      Number(
        (
          await ctx.dataSource.query(
            'SELECT TIMESTAMPDIFF(SECOND, NOW(3), wait_until) AS s FROM sign_in_throttle WHERE throttle_key = ?',
            [key],
          )
        )[0].s,
      );
    for (let i = 1; i <= ctx.config.LOGIN_FAILURE_LIMIT; i++)
      await login(a.url, person.email, `wrong-${i}`, ownAddress());
    const firstWait = await waitS();
    expect(firstWait).toBeGreaterThanOrEqual(25);
    expect(firstWait).toBeLessThanOrEqual(30);
    await ctx.dataSource.query(
      'UPDATE sign_in_throttle SET wait_until = NOW(3) WHERE throttle_key = ?',
      [key],
    );
    await login(a.url, person.email, 'wrong-again', ownAddress());
    expect(await waitS()).toBeGreaterThanOrEqual(55);
  });
});

describe('the signature password prompt', () => {
  it('is throttled like signing in: past the limit even the right password waits, and nothing is signed', async () => {
    await clearLoopbackCount();
    const clinician = await createTestPerson(ctx, ['clinician']);
    const agent = await signedInAgent(ctx, clinician);
    const patient = await createTestPatient(ctx);
    const draft = await agent.post('/api/orders').send(pdtOrder(patient.id));
    expect(draft.status).toBe(201);
    const id = draft.body.order.id;
    for (let i = 1; i <= ctx.config.LOGIN_FAILURE_LIMIT; i++) {
      expect(
        (
          await agent
            .post(`/api/orders/${id}/signature`)
            .send({ password: `wrong-${i}`, meaning: 'ordered', version: draft.body.order.version })
        ).status,
      ).toBe(400);
    }
    const res = await agent.post(`/api/orders/${id}/signature`).send({
      password: clinician.password,
      meaning: 'ordered',
      version: draft.body.order.version,
    });
    expect(res.status).toBe(429);
    expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
    const [order] = await ctx.dataSource.query('SELECT status FROM treatment_order WHERE id = ?', [
      id,
    ]);
    expect(order.status).toBe('draft');
    // The same count applies at the sign-in form.
    expect(
      (
        await supertest(ctx.app)
          .post('/api/auth/login')
          .send({ email: clinician.email, password: clinician.password })
      ).status,
    ).toBe(429);
  });
});
