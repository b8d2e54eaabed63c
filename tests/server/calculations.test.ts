import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestPerson, signedInAgent, startTestApp, type TestContext } from '../support/api';

let ctx: TestContext;
let agent: ReturnType<typeof supertest.agent>;
beforeAll(async () => {
  ctx = await startTestApp();
  agent = await signedInAgent(ctx, await createTestPerson(ctx, ['clinician']));
});
afterAll(async () => {
  await ctx.close();
});

const adult = { height: { value: 170, unit: 'cm' }, weight: { value: 70, unit: 'kg' } };

describe('POST /api/calculations', () => {
  it('computes the standard PDT plan with every figure and its working', async () => {
    const res = await agent.post('/api/calculations').send({
      protocol: { key: 'pdt-standard', version: 1 },
      inputs: { ...adult, bsaFormula: 'mosteller', lesionGldUm: 2500, lensMagnification: 1.0 },
    });
    expect(res.status).toBe(200);
    const { plan } = res.body;
    // Source: Mosteller RD. N Engl J Med 1987 — √(170 × 70 / 3600) = 1.8181 m², shown to 0.01.
    expect(plan.bsaM2).toBe(1.82);
    // Source: TAP Study Group, Arch Ophthalmol 1999 — 6 mg/m²; 2 mg/mL after reconstitution
    // (review table, Drug Discov Today 2008); 30 mL over 10 min = 3 mL/min.
    expect(plan.doseMg).toBeCloseTo(6 * 1.82, 2);
    expect(plan.drugVolumeMl).toBe(5.5);
    expect(plan.diluentVolumeMl).toBe(24.5);
    expect(plan.vials).toBe(1);
    expect(plan.infusionRateMlPerMin).toBe(3);
    // Source: TAP 1999 — spot = GLD + 1000 µm; 600 mW/cm² × 83 s = 49.8 J/cm²; light 15 min after infusion start.
    expect(plan.spotDiameterUm).toBe(3500);
    expect(plan.spotAreaCm2).toBeCloseTo((Math.PI * 0.35 ** 2) / 4, 5);
    expect(plan.powerMw).toBeCloseTo(57.7, 1);
    expect(plan.fluenceJPerCm2).toBeCloseTo(49.8, 5);
    expect(plan.lightStartAfterInfusionStartS).toBe(900);
    const bsa = plan.working.find((w: { name: string }) => w.name === 'bsaM2');
    expect(bsa).toMatchObject({ unit: 'm²', rounded: { value: 1.82, step: 0.01 } });
    expect(bsa.value).toBeCloseTo(1.8181, 4);
    expect(bsa.formula).toMatch(/Mosteller/);
    expect(res.body.protocol).toMatchObject({
      key: 'pdt-standard',
      version: 1,
      status: 'approved',
    });
  });

  it('uses the newest approved version when no version is given, and accepts pounds and inches', async () => {
    const res = await agent.post('/api/calculations').send({
      protocol: { key: 'pdt-half-dose' },
      inputs: {
        height: { value: 66.93, unit: 'in' },
        weight: { value: 154.32, unit: 'lb' },
        lesionGldUm: 1800,
        lensMagnification: 1,
      },
    });
    expect(res.status).toBe(200);
    // Version 3 (the device checks) is the newest shipped version.
    expect(res.body.protocol.version).toBe(3);
    // 66.93 in ≈ 170 cm and 154.32 lb ≈ 70 kg (1 in = 2.54 cm, 1 lb = 0.45359237 kg, exact by definition);
    // half-dose 3 mg/m² — Altinel MG et al. (half-dose vs half-fluence vs standard PDT in chronic CSC).
    expect(res.body.plan.bsaM2).toBe(1.82);
    expect(res.body.plan.doseMg).toBeCloseTo(3 * 1.82, 2);
  });

  it('computes the standard CXL plan and warns when the cornea is below the minimum thickness', async () => {
    const res = await agent
      .post('/api/calculations')
      .send({ protocol: { key: 'cxl-standard' }, inputs: { stromalThicknessUm: 380 } });
    expect(res.status).toBe(200);
    // Source: Wollensak G, Spoerl E, Seiler T. Am J Ophthalmol 2003 — 3 mW/cm² for 30 min = 5.4 J/cm².
    expect(res.body.plan.uvTimeS).toBe(1800);
    expect(res.body.plan.fluenceJPerCm2).toBeCloseTo(5.4, 5);
    // Source: Spoerl E et al. Cornea 2007 — minimum stromal thickness 400 µm.
    expect(res.body.plan.thicknessOk).toBe(false);
    expect(res.body.plan.warnings.map((w: { code: string }) => w.code)).toContain(
      'thickness-below-minimum',
    );
  });

  it('refuses an input outside the hard range with 400 naming the field and the allowed range', async () => {
    const res = await agent.post('/api/calculations').send({
      protocol: { key: 'pdt-standard', version: 1 },
      inputs: {
        height: { value: 20, unit: 'cm' },
        weight: { value: 70, unit: 'kg' },
        lesionGldUm: 2500,
        lensMagnification: 1,
      },
    });
    expect(res.status).toBe(400);
    const field = res.body.error.fields.find(
      (f: { path: string }) => f.path === 'inputs.height.value',
    );
    expect(field.message).toMatch(/between \d+ and \d+ cm/);
  });

  it('refuses a body of the wrong shape with 400 naming the fields', async () => {
    const res = await agent
      .post('/api/calculations')
      .send({ protocol: { key: 'pdt-standard', version: 'one' }, inputs: { height: 170 } });
    expect(res.status).toBe(400);
    const paths = res.body.error.fields.map((f: { path: string }) => f.path);
    expect(paths).toEqual(expect.arrayContaining(['protocol.version']));
    expect(paths.some((p: string) => p.startsWith('inputs.height'))).toBe(true);
  });

  it('an unknown protocol or version is 404', async () => {
    const unknown = await agent.post('/api/calculations').send({
      protocol: { key: 'pdt-unknown' },
      inputs: { ...adult, lesionGldUm: 2500, lensMagnification: 1 },
    });
    expect(unknown.status).toBe(404);
    const version = await agent.post('/api/calculations').send({
      protocol: { key: 'pdt-standard', version: 42 },
      inputs: { ...adult, lesionGldUm: 2500, lensMagnification: 1 },
    });
    expect(version.status).toBe(404);
  });

  it('needs a session', async () => {
    const res = await supertest(ctx.app).post('/api/calculations').send({});
    expect(res.status).toBe(401);
  });
});

describe('POST /api/light-calculations', () => {
  it('fills in irradiance, fluence and energy from power, spot and time', async () => {
    // Definitions (no source needed): area = π d²/4; irradiance = power ÷ area; fluence = irradiance × time.
    const res = await agent
      .post('/api/light-calculations')
      .send({ powerMw: 42.4, spotDiameterUm: 3000, exposureS: 83 });
    expect(res.status).toBe(200);
    const { solution } = res.body;
    expect(solution.irradianceMwPerCm2).toBeCloseTo(42.4 / 0.070686, 0);
    expect(solution.fluenceJPerCm2).toBeCloseTo(((42.4 / 0.070686) * 83) / 1000, 1);
    expect(solution.energyJ).toBeCloseTo(0.0424 * 83, 3);
  });

  it('answers the time from fluence and irradiance alone, and leaves what they do not fix empty', async () => {
    // Definition: exposure = fluence ÷ irradiance; 50 J/cm² at 600 mW/cm² (TAP Study Group 1999) → 83.3 s.
    const res = await agent
      .post('/api/light-calculations')
      .send({ fluenceJPerCm2: 50, irradianceMwPerCm2: 600 });
    expect(res.status).toBe(200);
    expect(res.body.solution.exposureS).toBeCloseTo(83.33, 2);
    expect(res.body.solution.powerMw).toBeNull();
    expect(res.body.solution.spotDiameterUm).toBeNull();
  });

  it('refuses too little to work with, naming the fields', async () => {
    const res = await agent.post('/api/light-calculations').send({ powerMw: 42.4 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.length).toBeGreaterThan(0);
  });
});
