import { randomUUID } from 'node:crypto';
import jwt from 'jsonwebtoken';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInCookieName } from '../../server/auth/sign-in-session';
import { createTestPerson, signedInAgent, startTestApp, type TestContext } from '../support/api';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(async () => {
  await ctx.close();
});

function sessionCookie(setCookie: string[] | string | undefined): string | undefined {
  const list = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  return list.find((c) => c.startsWith(`${signInCookieName}=`));
}

async function auditRows(where: string, params: unknown[]) {
  return ctx.dataSource.query(`SELECT * FROM audit_event WHERE ${where} ORDER BY id`, params);
}

describe('signing in', () => {
  it('with the right password sets an httpOnly, SameSite=Strict session cookie and returns the person', async () => {
    const person = await createTestPerson(ctx, ['clinician']);
    const res = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: person.email, password: person.password });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({
      id: person.id,
      email: person.email,
      roles: ['clinician'],
    });
    expect(res.body.user.capabilities).toContain('calculations.run');
    const cookie = sessionCookie(res.headers['set-cookie']);
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Strict/i);
    expect(cookie).toMatch(/Path=\//);
  });

  it('accepts the e-mail in any case and with spaces around it', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const res = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: `  ${person.email.toUpperCase()} `, password: person.password });
    expect(res.status).toBe(200);
  });

  it('with a wrong password is refused with 401, and an unknown e-mail gets the very same answer', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const wrongPassword = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: person.email, password: 'not-the-password' });
    const unknownEmail = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: 'nobody-here@test.luxtempo.example', password: 'whatever-it-is' });
    expect(wrongPassword.status).toBe(401);
    expect(unknownEmail.status).toBe(401);
    expect(unknownEmail.body).toEqual(wrongPassword.body);
    expect(sessionCookie(wrongPassword.headers['set-cookie'])).toBeUndefined();
  });

  it('without a password is refused with 400 naming the field', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: 'someone@test.luxtempo.example' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([expect.objectContaining({ path: 'password' })]);
  });

  it('with a malformed e-mail is refused with 400 naming the field', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: 'not an address', password: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['email']);
  });

  it('with a body that is not JSON is refused with 400', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/login')
      .set('Content-Type', 'application/json')
      .send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
  });

  it('is refused for a deactivated person, with the same 401 as any failure', async () => {
    const person = await createTestPerson(ctx, ['pharmacist'], { active: false });
    const res = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: person.email, password: person.password });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('invalid_credentials');
  });

  it('writes an audit row for a sign-in and for a failed sign-in', async () => {
    const person = await createTestPerson(ctx, ['auditor']);
    await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: person.email, password: 'wrong-password' });
    await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: person.email, password: person.password });
    const rows = await auditRows('entity_type = ? AND entity_id = ?', ['user', String(person.id)]);
    expect(rows.map((r: { action: string }) => r.action)).toEqual(['sign-in.failed', 'sign-in']);
    expect(rows[0].details).toMatchObject({ reason: 'wrong-password', email: person.email });
  });
});

// Every test here signs in from 127.0.0.1; a test of the per-address count comes through a
// trusted proxy with an address of its own, so it neither meets nor leaves other tests' failures.

describe('failed sign-in limits', () => {
  it('answers the 11th failure for one account within 15 minutes with 429 and Retry-After', async () => {
    const limited = await startTestApp({ TRUST_PROXY: 'loopback' });
    const address = `2001:db8::${randomUUID().slice(0, 4)}`;
    try {
      const person = await createTestPerson(limited, ['nurse']);
      for (let attempt = 1; attempt <= 10; attempt++) {
        const res = await supertest(limited.app)
          .post('/api/auth/login')
          .set('X-Forwarded-For', address)
          .send({ email: person.email, password: `wrong-${attempt}` });
        expect(res.status).toBe(401);
      }
      const eleventh = await supertest(limited.app)
        .post('/api/auth/login')
        .set('X-Forwarded-For', address)
        .send({ email: person.email, password: person.password });
      expect(eleventh.status).toBe(429);
      expect(eleventh.body.error.code).toBe('too_many_attempts');
      expect(Number(eleventh.headers['retry-after'])).toBeGreaterThan(0);
    } finally {
      await limited.close();
    }
  });

  it('limits one address trying many accounts, and does not count successful sign-ins', async () => {
    const limited = await startTestApp({ TRUST_PROXY: 'loopback' });
    const address = `2001:db8::${randomUUID().slice(0, 4)}`;
    try {
      const person = await createTestPerson(limited, ['nurse']);
      for (let i = 0; i < 11; i++) {
        const ok = await supertest(limited.app)
          .post('/api/auth/login')
          .set('X-Forwarded-For', address)
          .send({ email: person.email, password: person.password });
        expect(ok.status).toBe(200);
      }
      const guess = randomUUID().slice(0, 8);
      for (let i = 1; i <= 10; i++) {
        const res = await supertest(limited.app)
          .post('/api/auth/login')
          .set('X-Forwarded-For', address)
          .send({ email: `guess-${guess}-${i}@test.luxtempo.example`, password: 'guess' });
        expect(res.status).toBe(401);
      }
      const next = await supertest(limited.app)
        .post('/api/auth/login')
        .set('X-Forwarded-For', address)
        .send({ email: `guess-${guess}-11@test.luxtempo.example`, password: 'guess' });
      expect(next.status).toBe(429);
    } finally {
      await limited.close();
    }
  });
});

describe('the session', () => {
  it('me without a cookie is 401', async () => {
    const res = await supertest(ctx.app).get('/api/auth/me');
    expect(res.status).toBe(401);
  });

  it('me with a session returns id, e-mail, name, roles and capabilities', async () => {
    const person = await createTestPerson(ctx, ['nurse', 'admin']);
    const agent = await signedInAgent(ctx, person);
    const res = await agent.get('/api/auth/me');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      id: person.id,
      email: person.email,
      roles: ['nurse', 'admin'],
    });
    expect(res.body.capabilities).toEqual(expect.arrayContaining(['people.manage', 'today.view']));
  });

  it('a tampered token is 401', async () => {
    const person = await createTestPerson(ctx, ['clinician']);
    const login = await supertest(ctx.app)
      .post('/api/auth/login')
      .send({ email: person.email, password: person.password });
    const token = sessionCookie(login.headers['set-cookie'])!.split(';')[0]!.split('=')[1]!;
    const [header, , signature] = token.split('.');
    const forgedPayload = Buffer.from(
      JSON.stringify({ sub: '1', iss: 'luxtempo', exp: Math.floor(Date.now() / 1000) + 3600 }),
    ).toString('base64url');
    const res = await supertest(ctx.app)
      .get('/api/auth/me')
      .set('Cookie', `${signInCookieName}=${header}.${forgedPayload}.${signature}`);
    expect(res.status).toBe(401);
  });

  it('a token signed with another secret is 401', async () => {
    const person = await createTestPerson(ctx, ['clinician']);
    const token = jwt.sign({}, 'some-other-secret-that-is-long-enough-0123456789', {
      subject: String(person.id),
      issuer: 'luxtempo',
      expiresIn: '1h',
    });
    const res = await supertest(ctx.app)
      .get('/api/auth/me')
      .set('Cookie', `${signInCookieName}=${token}`);
    expect(res.status).toBe(401);
  });

  it('an expired token is 401', async () => {
    const person = await createTestPerson(ctx, ['clinician']);
    const token = jwt.sign({ exp: Math.floor(Date.now() / 1000) - 60 }, ctx.config.JWT_SECRET, {
      subject: String(person.id),
      issuer: 'luxtempo',
    });
    const res = await supertest(ctx.app)
      .get('/api/auth/me')
      .set('Cookie', `${signInCookieName}=${token}`);
    expect(res.status).toBe(401);
  });

  it('a person deactivated after signing in is 401 on their next call', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, person);
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    await ctx.dataSource.query('UPDATE user SET active = 0 WHERE id = ?', [person.id]);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('signing out clears the cookie and is recorded', async () => {
    const person = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, person);
    const res = await agent.post('/api/auth/logout');
    expect(res.status).toBe(204);
    expect(sessionCookie(res.headers['set-cookie'])).toMatch(/Expires=Thu, 01 Jan 1970/);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
    const rows = await auditRows('action = ? AND actor_user_id = ?', ['sign-out', person.id]);
    expect(rows).toHaveLength(1);
  });
});

describe('the API as a whole', () => {
  it('health answers 200 with the database status, without a session', async () => {
    const res = await supertest(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'ok', database: { status: 'up' } });
  });

  it('tells anyone the unit’s name, time zone, locale and telephone, which the client formats times and dates with', async () => {
    const res = await supertest(ctx.app).get('/api/unit');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      name: ctx.config.UNIT_NAME,
      timeZone: ctx.config.UNIT_TIME_ZONE,
      locale: ctx.config.UNIT_LOCALE,
      phone: ctx.config.UNIT_PHONE,
    });
  });

  it('sends security headers, with no upgrade-insecure-requests on plain http', async () => {
    const res = await supertest(ctx.app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['content-security-policy']).not.toContain('upgrade-insecure-requests');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('an unknown API route is a JSON 404', async () => {
    const res = await supertest(ctx.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('refuses a state-changing request sent from another site', async () => {
    const person = await createTestPerson(ctx, ['admin']);
    const agent = await signedInAgent(ctx, person);
    const res = await agent.post('/api/people').set('Origin', 'http://evil.example').send({});
    expect(res.status).toBe(403);
  });
});
