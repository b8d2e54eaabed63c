import { randomUUID } from 'node:crypto';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestPerson, signedInAgent, startTestApp, type TestContext } from '../support/api';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(async () => {
  await ctx.close();
});

const newEmail = () => `new-${randomUUID().slice(0, 8)}@test.luxtempo.example`;

async function auditActions(entityId: number): Promise<string[]> {
  const rows = await ctx.dataSource.query(
    'SELECT action FROM audit_event WHERE entity_type = ? AND entity_id = ? ORDER BY id',
    ['user', String(entityId)],
  );
  return rows.map((r: { action: string }) => r.action);
}

describe('people administration', () => {
  it('an admin lists people, without password hashes', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const agent = await signedInAgent(ctx, admin);
    const res = await agent.get('/api/people');
    expect(res.status).toBe(200);
    const me = res.body.people.find((p: { id: number }) => p.id === admin.id);
    expect(me).toMatchObject({ email: admin.email, roles: ['admin'], active: true });
    expect(JSON.stringify(res.body)).not.toMatch(/password|\$2[aby]\$/i);
  });

  it('a nurse calling a people route gets 403, and nobody signed in gets 401', async () => {
    const nurse = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, nurse);
    expect((await agent.get('/api/people')).status).toBe(403);
    expect((await agent.post('/api/people').send({})).status).toBe(403);
    expect((await supertest(ctx.app).get('/api/people')).status).toBe(401);
  });

  it('an admin creates a person with roles and no password: the person cannot sign in until they set one through their link; the change is audited', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const agent = await signedInAgent(ctx, admin);
    const email = newEmail();
    const res = await agent.post('/api/people').send({
      email,
      displayName: 'Ada Testperson',
      roles: ['nurse', 'auditor'],
      password: 'a-first-password-1',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ passwordLink: 'sent' });
    expect(res.body.person).toMatchObject({
      email,
      roles: ['nurse', 'auditor'],
      active: true,
      accountReady: false,
    });
    // A password sent along by an old client is ignored, never stored.
    const login = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email, password: 'a-first-password-1' });
    expect(login.status).toBe(401);
    expect(await auditActions(res.body.person.id)).toEqual(
      expect.arrayContaining(['person.created', 'person.password-link-sent']),
    );
  });

  it('creating a person with bad fields is refused with 400 naming each field and its rule', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const agent = await signedInAgent(ctx, admin);
    const res = await agent
      .post('/api/people')
      .send({ email: 'nope', displayName: 'A', roles: ['surgeon'] });
    expect(res.status).toBe(400);
    const paths = res.body.error.fields.map((f: { path: string }) => f.path);
    expect(paths).toEqual(expect.arrayContaining(['email', 'displayName', 'roles.0']));
  });

  it('an e-mail already in use is a 409', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const agent = await signedInAgent(ctx, admin);
    const res = await agent
      .post('/api/people')
      .send({ email: admin.email, displayName: 'Someone Else', roles: ['nurse'] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_taken');
  });

  it('an admin changes roles; the new roles apply on the next call', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const other = await createTestPerson(ctx, ['nurse']);
    const adminAgent = await signedInAgent(ctx, admin);
    const otherAgent = await signedInAgent(ctx, other);
    expect((await otherAgent.get('/api/people')).status).toBe(403);
    const res = await adminAgent
      .patch(`/api/people/${other.id}`)
      .send({ roles: ['nurse', 'admin'] });
    expect(res.status).toBe(200);
    expect(res.body.person.roles).toEqual(['nurse', 'admin']);
    expect((await otherAgent.get('/api/people')).status).toBe(200);
    expect(await auditActions(other.id)).toContain('person.updated');
  });

  it('an admin cannot remove their own admin role', async () => {
    const admin = await createTestPerson(ctx, ['nurse', 'admin']);
    const agent = await signedInAgent(ctx, admin);
    const res = await agent.patch(`/api/people/${admin.id}`).send({ roles: ['nurse'] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('own_admin_role');
    expect((await agent.get('/api/auth/me')).body.roles).toEqual(['nurse', 'admin']);
  });

  it('a deactivated person cannot sign in, their record stays, and they can be reactivated', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const other = await createTestPerson(ctx, ['pharmacist']);
    const agent = await signedInAgent(ctx, admin);
    const off = await agent.patch(`/api/people/${other.id}`).send({ active: false });
    expect(off.status).toBe(200);
    expect(off.body.person.active).toBe(false);
    expect(
      (
        await supertest(ctx.app)
          .post('/api/auth/login')
          .send({ email: other.email, password: other.password })
      ).status,
    ).toBe(401);
    const listed = (await agent.get('/api/people')).body.people.find(
      (p: { id: number }) => p.id === other.id,
    );
    expect(listed).toMatchObject({ active: false, email: other.email });
    await agent.patch(`/api/people/${other.id}`).send({ active: true });
    expect(
      (
        await supertest(ctx.app)
          .post('/api/auth/login')
          .send({ email: other.email, password: other.password })
      ).status,
    ).toBe(200);
    expect(await auditActions(other.id)).toEqual(
      expect.arrayContaining(['person.deactivated', 'person.reactivated']),
    );
  });

  it('changing a person who does not exist is a 404, and a bad id a 400 naming it', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const agent = await signedInAgent(ctx, admin);
    expect((await agent.patch('/api/people/99999999').send({ active: false })).status).toBe(404);
    const bad = await agent.patch('/api/people/abc').send({ active: false });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('id');
  });
});
