import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createTestPatient,
  createTestPerson,
  cxlOrder,
  pdtOrder,
  preparedPdtOrder,
  signOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';
import { readyBench } from '../support/devices';

type Agent = ReturnType<typeof supertest.agent>;
let ctx: TestContext;
let clinician: TestPerson;
let clinicianAgent: Agent;
let pharmacistAgent: Agent;
let nurseAgent: Agent;
let draftId: number;
let signedId: number;
let preparedId: number;
let readyId: number;

beforeAll(async () => {
  ctx = await startTestApp();
  clinician = await createTestPerson(ctx, ['clinician']);
  clinicianAgent = await signedInAgent(ctx, clinician);
  pharmacistAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['pharmacist']));
  nurseAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
  const patient = await createTestPatient(ctx);
  draftId = (await clinicianAgent.post('/api/orders').send(pdtOrder(patient.id))).body.order.id;
  signedId = (await signOrder(clinicianAgent, clinician, pdtOrder(patient.id, { eye: 'left' }))).id;
  preparedId = (
    await preparedPdtOrder(ctx, {
      clinician: [clinicianAgent, clinician],
      pharmacist: pharmacistAgent,
    })
  ).id;
  const ready = await signOrder(
    clinicianAgent,
    clinician,
    cxlOrder((await createTestPatient(ctx)).id),
  );
  readyId = ready.id;
  const bench = await readyBench(await signedInAgent(ctx, await createTestPerson(ctx, ['admin'])));
  const started = await nurseAgent.post(`/api/orders/${readyId}/session-events`).send({
    idempotencyKey: randomUUID(),
    clientTime: new Date().toISOString(),
    type: 'session-started',
    checks: {
      patientIdentity: true,
      treatmentEye: true,
      consent: true,
      eyewear: true,
      deviceSettings: true,
    },
    device: bench.deviceFor(ready),
  });
  if (started.status !== 201)
    throw new Error(`session start failed: ${JSON.stringify(started.body)}`);
});
afterAll(async () => {
  await ctx.close();
});

/** Text an attacker or a confused form might send. */
const nastyText = fc.constantFrom(
  "Robert'); DROP TABLE patient;--",
  '1 OR 1=1',
  '<script>alert(1)</script>',
  '<img src=x onerror=alert(1)>',
  '{{constructor.constructor("return 1")()}}',
  '\u0000\u202e',
  'NaN',
  'Infinity',
  '-0',
  '1e309',
  '170',
  '',
  ' ',
  'a'.repeat(5000),
);
/** A value of the wrong kind where a measurement belongs. */
const junk: fc.Arbitrary<unknown> = fc.oneof(
  nastyText,
  fc.constantFrom(
    null,
    true,
    false,
    0,
    -1,
    1e308,
    -1e308,
    Number.MAX_SAFE_INTEGER,
    0.1 + 0.2,
    [],
    {},
    [[[]]],
  ),
  fc.double(),
  fc.integer(),
  fc.array(fc.integer(), { maxLength: 2000 }),
  fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 3 }), { maxKeys: 5 }),
  fc.jsonValue({ maxDepth: 6 }),
);

/** A valid body with some fields (at any depth) replaced by junk, dropped, or joined by extra keys. */
function mutated(valid: Record<string, unknown>): fc.Arbitrary<unknown> {
  const paths: string[][] = [];
  const walk = (value: unknown, path: string[]) => {
    if (value && typeof value === 'object' && !Array.isArray(value)) {
      for (const [k, v] of Object.entries(value)) {
        paths.push([...path, k]);
        walk(v, [...path, k]);
      }
    }
  };
  walk(valid, []);
  const edit = fc.record({
    path: fc.constantFrom(...paths),
    kind: fc.constantFrom('replace', 'drop', 'extra'),
    value: junk,
  });
  return fc.array(edit, { minLength: 1, maxLength: 3 }).map((edits) => {
    const copy = structuredClone(valid);
    for (const { path, kind, value } of edits) {
      let target = copy as Record<string, unknown>;
      for (const key of path.slice(0, -1)) {
        if (!target[key] || typeof target[key] !== 'object') break;
        target = target[key] as Record<string, unknown>;
      }
      const last = path.at(-1)!;
      if (kind === 'replace') target[last] = value;
      else if (kind === 'drop') delete target[last];
      else target[`${last}Extra`] = value;
    }
    return copy;
  });
}

const anyBody = fc.oneof(junk, fc.jsonValue({ maxDepth: 8 }));

interface Target {
  name: string;
  agent: () => Agent;
  method: 'post' | 'put';
  url: () => string;
  body: fc.Arbitrary<unknown>;
}

const targets: Target[] = [
  {
    name: 'calculation',
    agent: () => clinicianAgent,
    method: 'post',
    url: () => '/api/calculations',
    body: fc.oneof(
      anyBody,
      mutated({
        protocol: { key: 'pdt-standard', version: 1 },
        inputs: {
          height: { value: 170, unit: 'cm' },
          weight: { value: 70, unit: 'kg' },
          bsaFormula: 'mosteller',
          lesionGldUm: 2500,
          lensMagnification: 1,
        },
      }),
    ),
  },
  {
    name: 'order',
    agent: () => clinicianAgent,
    method: 'post',
    url: () => '/api/orders',
    body: fc.oneof(anyBody, mutated(pdtOrder(1) as Record<string, unknown>)),
  },
  {
    name: 'order edit',
    agent: () => clinicianAgent,
    method: 'put',
    url: () => `/api/orders/${draftId}`,
    body: fc.oneof(anyBody, mutated({ ...(pdtOrder(1) as Record<string, unknown>), version: 1 })),
  },
  {
    name: 'dose check',
    agent: () => pharmacistAgent,
    method: 'post',
    url: () => `/api/orders/${signedId}/dose-checks`,
    body: fc.oneof(
      anyBody,
      mutated({ bsaM2: 1.82, doseMg: 10.92, drugVolumeMl: 5.46, comment: 'ok' }),
    ),
  },
  {
    name: 'preparation',
    agent: () => pharmacistAgent,
    method: 'post',
    url: () => `/api/orders/${preparedId}/preparation`,
    body: fc.oneof(
      anyBody,
      mutated({
        vialLot: 'LOT-1',
        vialExpiry: '2030-01-01',
        reconstitutedAt: new Date().toISOString(),
        volumeDrawnMl: 5.5,
      }),
    ),
  },
  {
    name: 'session event',
    agent: () => nurseAgent,
    method: 'post',
    url: () => `/api/orders/${readyId}/session-events`,
    body: fc.oneof(
      anyBody,
      mutated({
        idempotencyKey: randomUUID(),
        clientTime: new Date().toISOString(),
        type: 'thickness-measured',
        stepId: 'thickness-check',
        thicknessUm: 450,
      }),
      mutated({
        idempotencyKey: randomUUID(),
        clientTime: new Date().toISOString(),
        type: 'session-stopped',
        reason: 'patient unwell today',
      }),
      mutated({
        idempotencyKey: randomUUID(),
        clientTime: new Date().toISOString(),
        type: 'tap-withdrawn',
        withdrawnKey: randomUUID(),
        reason: 'tapped by mistake',
      }),
    ),
  },
  {
    name: 'patient',
    agent: () => clinicianAgent,
    method: 'post',
    url: () => '/api/patients',
    body: fc.oneof(
      anyBody,
      mutated({
        recordNumber: 'X-123',
        givenName: 'Ann',
        familyName: 'Example',
        dateOfBirth: '1960-01-01',
        email: 'a@b.example',
        emailConsent: true,
      }),
    ),
  },
];

/** The answer's text with every key and string of the request body taken out (raw and JSON-escaped). */
function withoutEchoes(answer: string, body: unknown): string {
  const said = new Set<string>();
  const walk = (value: unknown) => {
    if (typeof value === 'string') said.add(value);
    else if (Array.isArray(value)) value.forEach(walk);
    else if (value && typeof value === 'object')
      for (const [key, inner] of Object.entries(value)) {
        said.add(key);
        walk(inner);
      }
  };
  walk(body);
  let text = answer;
  for (const s of [...said].filter((s) => s.length > 0).sort((a, b) => b.length - a.length)) {
    text = text
      .split(JSON.stringify(JSON.stringify(s).slice(1, -1)).slice(1, -1))
      .join('')
      .split(JSON.stringify(s).slice(1, -1))
      .join('');
  }
  return text;
}

const runsPerTarget = 1500; // 7 targets × 1,500 = 10,500 bodies

describe('random and malformed bodies', () => {
  for (const target of targets) {
    it(
      `never break the ${target.name} route: no 500, and every 400 names a field`,
      { timeout: 240_000 },
      async () => {
        await fc.assert(
          fc.asyncProperty(target.body, async (body) => {
            const res = await target
              .agent()
              [target.method](target.url())
              .set('Content-Type', 'application/json')
              .send(JSON.stringify(body) ?? 'null');
            expect(res.status).toBeLessThan(500);
            if (res.status === 400) {
              expect(res.body.error.fields.length).toBeGreaterThan(0);
              for (const field of res.body.error.fields) {
                expect(typeof field.path).toBe('string');
                expect(field.path.length).toBeGreaterThan(0);
                expect(field.message.length).toBeGreaterThan(0);
              }
            }
            // What the body itself said may come back in a message naming the field; only the server's own internals are a leak.
            expect(withoutEchoes(JSON.stringify(res.body), body)).not.toMatch(
              /\bat \S+\.(ts|js):\d+|ER_[A-Z_]+|SELECT |INSERT INTO/,
            );
          }),
          // A key named like a database error code once failed the leak check by being echoed back.
          { numRuns: runsPerTarget, examples: [[{ ER_A: {} }]] },
        );
      },
    );
  }

  it('bodies that are not JSON at all, or too large, are refused cleanly', async () => {
    for (const raw of [
      '{"a":',
      'NaN',
      '{"x": Infinity}',
      "{'single': 'quotes'}",
      '\u0000',
      '[1,2,',
    ]) {
      const res = await clinicianAgent
        .post('/api/orders')
        .set('Content-Type', 'application/json')
        .send(raw);
      expect(res.status).toBe(400);
      expect(res.body.error.fields[0].path).toBe('body');
    }
    const huge = await clinicianAgent.post('/api/orders').send({ note: 'x'.repeat(300 * 1024) });
    expect(huge.status).toBe(413);
    expect((await supertest(ctx.app).get('/api/health')).status).toBe(200);
  });

  it('SQL and HTML typed into text fields are stored and returned exactly as typed, and do nothing', async () => {
    const text = {
      givenName: `<script>alert("x")</script>`,
      familyName: "O'Brien'); DROP TABLE patient;--",
    };
    const created = await clinicianAgent
      .post('/api/patients')
      .send({ recordNumber: `S-${randomUUID().slice(0, 8)}`, dateOfBirth: '1950-05-05', ...text });
    expect(created.status).toBe(201);
    const read = await clinicianAgent.get(`/api/patients/${created.body.patient.id}`);
    expect(read.body.patient).toMatchObject(text);
    expect(read.headers['content-type']).toMatch(/application\/json/);
    expect(
      Number((await ctx.dataSource.query('SELECT COUNT(*) AS n FROM patient'))[0].n),
    ).toBeGreaterThan(0);
  });
});
