import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createTestPatient,
  createTestPerson,
  pdtOrder,
  signOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';

type Agent = ReturnType<typeof supertest.agent>;
let ctx: TestContext;
let clinician: TestPerson;
let clinicianAgent: Agent;
let pharmacistAgent: Agent;

beforeAll(async () => {
  ctx = await startTestApp();
  clinician = await createTestPerson(ctx, ['clinician']);
  clinicianAgent = await signedInAgent(ctx, clinician);
  pharmacistAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['pharmacist']));
});
afterAll(async () => {
  await ctx.close();
});

/** Words a person should never read in a refusal: key names and internal paths. */
const rawWords =
  /\b(inputs\.|height\.value|weight\.value|bsaM2|doseMg|drugVolumeMl|volumeDrawnMl|lesionGldUm|lensMagnification|retreatmentReason|recordNumber|givenName|familyName|dateOfBirth|patientId)\b/;

function expectSpoken(body: { error: { message: string; fields?: { message: string }[] } }) {
  const texts = [body.error.message, ...(body.error.fields ?? []).map((f) => f.message)];
  for (const text of texts) {
    expect(text).not.toMatch(rawWords);
    expect(text).not.toMatch(/\.\./);
    expect(text).not.toMatch(/\b1 [a-z]+s\b/);
  }
}

async function ordersOf(patientId: number) {
  const [row] = await ctx.dataSource.query(
    'SELECT COUNT(*) AS n FROM treatment_order WHERE patient_id = ?',
    [patientId],
  );
  return Number(row.n);
}

describe('refusals speak the user’s language and name every bad input at once', () => {
  it('an order with five bad fields, of the schema’s and of the protocol’s kind, gets one answer naming all five', async () => {
    const patient = await createTestPatient(ctx);
    const res = await clinicianAgent.post('/api/orders').send(
      pdtOrder(patient.id, {
        eye: 'up',
        inputs: {
          height: { value: -3, unit: 'cm' },
          weight: { value: 'x', unit: 'kg' },
          bsaFormula: 'mosteller',
          lesionGldUm: 9000,
          lensMagnification: 1,
        },
        retreatmentReason: 'a',
      }),
    );
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(
      [
        'eye',
        'inputs.height.value',
        'inputs.lesionGldUm',
        'inputs.weight.value',
        'retreatmentReason',
      ].sort(),
    );
    const byPath = Object.fromEntries(
      res.body.error.fields.map((f: { path: string; message: string }) => [f.path, f.message]),
    );
    expect(byPath['inputs.height.value']).toMatch(/^Height /);
    expect(byPath['retreatmentReason']).toMatch(/^The retreatment reason must be 5 to 500/);
    // pdt-standard v1: spot = GLD + 1000 µm, largest spot 6400 µm (protocol file).
    expect(byPath['inputs.lesionGldUm']).toMatch(
      /\(got 9000 µm\): its spot .* = 10000 µm\) would pass the largest spot of 6400 µm/,
    );
    expectSpoken(res.body);
    expect(await ordersOf(patient.id)).toBe(0);
  });

  it('out-of-range measurements are all reported together, in words', async () => {
    const patient = await createTestPatient(ctx);
    const res = await clinicianAgent.post('/api/orders').send(
      pdtOrder(patient.id, {
        inputs: {
          height: { value: 5, unit: 'cm' },
          weight: { value: 900, unit: 'kg' },
          bsaFormula: 'mosteller',
          lesionGldUm: 6000,
          lensMagnification: 1,
        },
      }),
    );
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'inputs.height.value',
      'inputs.weight.value',
      'inputs.lesionGldUm',
    ]);
    expect(res.body.error.fields[0].message).toMatch(/^Height must be between/);
    expectSpoken(res.body);
    expect(await ordersOf(patient.id)).toBe(0);
  });

  it('a dose check with three bad figures names the BSA, the dose and the drug volume, not their keys', async () => {
    const patient = await createTestPatient(ctx);
    const order = await signOrder(clinicianAgent, clinician, pdtOrder(patient.id));
    const res = await pharmacistAgent
      .post(`/api/orders/${order.id}/dose-checks`)
      .send({ bsaM2: -1, doseMg: 'a', drugVolumeMl: 500 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { message: string }) => f.message)).toEqual([
      expect.stringMatching(/^BSA /),
      expect.stringMatching(/^Dose /),
      expect.stringMatching(/^Drug volume /),
    ]);
    expectSpoken(res.body);
    const checks = await ctx.dataSource.query('SELECT id FROM dose_check WHERE order_id = ?', [
      order.id,
    ]);
    expect(checks).toEqual([]);
  });

  it('a figure that differs is named in words in the mismatch', async () => {
    const patient = await createTestPatient(ctx);
    const order = await signOrder(clinicianAgent, clinician, pdtOrder(patient.id));
    // 170 cm / 70 kg: Mosteller BSA 1.82 m² (Mosteller RD, N Engl J Med 1987); 6 mg/m² → 10.92 mg
    // (TAP Study Group, Arch Ophthalmol 1999); 2 mg/mL → 5.46 mL. The volume is entered wrong.
    const res = await pharmacistAgent
      .post(`/api/orders/${order.id}/dose-checks`)
      .send({ bsaM2: 1.82, doseMg: 10.92, drugVolumeMl: 9 });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/differ from the plan: drug volume\./);
    expectSpoken(res.body);
  });

  it('a new patient with four bad fields gets all four, by their names on the form', async () => {
    const res = await clinicianAgent
      .post('/api/patients')
      .send({ recordNumber: 'x', givenName: '', dateOfBirth: '2990-01-01' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { message: string }) => f.message)).toEqual([
      expect.stringMatching(/^Record number must be 3 to 20/),
      expect.stringMatching(/^Given name must be 1 to 80/),
      expect.stringMatching(/^Family name is required/),
      expect.stringMatching(/^Date of birth must lie between/),
    ]);
    expectSpoken(res.body);
  });
});
