import { randomUUID } from 'node:crypto';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestPerson, signedInAgent, startTestApp, type TestContext } from '../support/api';

type Agent = ReturnType<typeof supertest.agent>;
let ctx: TestContext;
let clinicianAgent: Agent;
let nurseAgent: Agent;

beforeAll(async () => {
  ctx = await startTestApp();
  clinicianAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['clinician']));
  nurseAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
});
afterAll(async () => {
  await ctx.close();
});

const recordNumber = () => `D-${randomUUID().slice(0, 8).toUpperCase()}`;
function person(familyName: string, overrides: Record<string, unknown> = {}) {
  return {
    recordNumber: recordNumber(),
    givenName: 'Ailsa',
    familyName,
    dateOfBirth: '1948-02-29',
    ...overrides,
  };
}

async function countNamed(familyName: string) {
  const [row] = await ctx.dataSource.query(
    'SELECT COUNT(*) AS n FROM patient WHERE family_name = ?',
    [familyName],
  );
  return Number(row.n);
}

describe('a new patient with the same name and date of birth as an existing one', () => {
  it('is refused without an explicit confirmation and a reason of substance; nothing is stored', async () => {
    const family = `Dunmore-${randomUUID().slice(0, 6)}`;
    const first = await clinicianAgent.post('/api/patients').send(person(family));
    expect(first.status, JSON.stringify(first.body)).toBe(201);

    // Same person typed again by a hurried colleague: other record number, other letter case, extra spaces.
    const again = person(family.toUpperCase(), { givenName: '  ailsa ' });
    for (const extra of [
      {},
      { duplicateReason: 'Different person, checked with the ward.' },
      { duplicateConfirmed: true },
      { duplicateConfirmed: true, duplicateReason: 'ok' },
      { duplicateConfirmed: true, duplicateReason: 'n/a n/a n/a n/a n/a' },
    ]) {
      const res = await clinicianAgent.post('/api/patients').send({ ...again, ...extra });
      expect(res.status, JSON.stringify(extra)).toBe(409);
      expect(res.body.error.code).toBe('possible_duplicate_patient');
      expect(res.body.error.message).toContain(first.body.patient.recordNumber);
      expect(res.body.error.fields[0].path).toMatch(/^duplicate(Confirmed|Reason)$/);
    }
    expect(await countNamed(family)).toBe(1);

    const confirmed = await clinicianAgent.post('/api/patients').send({
      ...again,
      duplicateConfirmed: true,
      duplicateReason:
        'Twin sister: different hospital number and address, confirmed at reception.',
    });
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(201);
    expect(await countNamed(family)).toBe(2);
    const [audit] = await ctx.dataSource.query(
      "SELECT details FROM audit_event WHERE action = 'patient.created' AND entity_id = ?",
      [confirmed.body.patient.id],
    );
    const details = typeof audit.details === 'string' ? JSON.parse(audit.details) : audit.details;
    expect(details.possibleDuplicateOf).toEqual([first.body.patient.id]);
  });

  it('another date of birth is no duplicate', async () => {
    const family = `Carrick-${randomUUID().slice(0, 6)}`;
    expect((await clinicianAgent.post('/api/patients').send(person(family))).status).toBe(201);
    const other = await clinicianAgent
      .post('/api/patients')
      .send(person(family, { dateOfBirth: '1948-03-01' }));
    expect(other.status).toBe(201);
  });

  it('the possible duplicates are listed before saving, for those who may add patients', async () => {
    const family = `Strand-${randomUUID().slice(0, 6)}`;
    const first = await clinicianAgent.post('/api/patients').send(person(family));
    const query = { givenName: 'Ailsa', familyName: family, dateOfBirth: '1948-02-29' };
    const found = await clinicianAgent.get('/api/patients/possible-duplicates').query(query);
    expect(found.status).toBe(200);
    expect(found.body.patients.map((p: { id: number }) => p.id)).toEqual([first.body.patient.id]);
    const none = await clinicianAgent
      .get('/api/patients/possible-duplicates')
      .query({ ...query, dateOfBirth: '1950-01-01' });
    expect(none.body.patients).toEqual([]);
    expect((await nurseAgent.get('/api/patients/possible-duplicates').query(query)).status).toBe(
      403,
    );
  });
});
