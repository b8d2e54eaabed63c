import { randomUUID } from 'node:crypto';
import type supertest from 'supertest';

type Agent = ReturnType<typeof supertest.agent>;

/** A device body the register takes: a laser or a UV source with wide demo ranges (invented). */
export function deviceBody(kind: 'laser' | 'uv', overrides: Record<string, unknown> = {}) {
  const laser = kind === 'laser';
  return {
    name: `Test ${laser ? 'laser' : 'UV source'} ${randomUUID().slice(0, 8)}`,
    kind,
    wavelengthNm: laser ? 689 : 370,
    serialNumber: `SN-${randomUUID().slice(0, 6)}`,
    location: 'Test room 1',
    powerRangeMw: laser ? { min: 1, max: 500 } : null,
    spotRangeUm: laser ? { min: 500, max: 7000 } : null,
    irradianceRangeMwPerCm2: laser ? null : { min: 1, max: 45 },
    pulsedAvailable: !laser,
    serviceDueOn: '2099-12-31',
    status: 'in-use',
    outOfServiceReason: null,
    ...overrides,
  };
}

/** Adds a device as someone who may manage the register; returns it. */
export async function addDevice(
  manager: Agent,
  kind: 'laser' | 'uv',
  overrides: Record<string, unknown> = {},
) {
  const res = await manager.post('/api/devices').send(deviceBody(kind, overrides));
  if (res.status !== 201) throw new Error(`adding a device failed: ${JSON.stringify(res.body)}`);
  return res.body.device as { id: number; name: string; version: number; kind: string };
}

/** The meter: a fictitious identity, calibrated until well after the tests run. */
export const testMeter = { meterIdentity: 'Test meter PM-01', meterCalibrationDueOn: '2099-06-30' };

/** Records an output check: `set` and `measured` in mW (laser) or mW/cm² (UV). */
export function checkDevice(
  agent: Agent,
  device: { id: number; kind: string },
  set: number,
  measured: number,
  extra: Record<string, unknown> = {},
) {
  const figures =
    device.kind === 'laser'
      ? { powerSetMw: set, powerMeasuredMw: measured }
      : { irradianceSetMwPerCm2: set, irradianceMeasuredMwPerCm2: measured };
  return agent
    .post(`/api/devices/${device.id}/output-checks`)
    .send({ ...figures, ...testMeter, ...extra });
}

/** What a session start needs of an order to name its device and lens. */
interface OrderForStart {
  inputs?: { lensId?: number; lensMagnification?: number };
  plan: {
    deviceSpotDiameterUm?: number | null;
    powerMw?: number | null;
    irradianceMwPerCm2?: number | null;
  };
  protocol?: { key?: string };
}

/**
 * A bench ready for today's sessions, as the unit's device lead would leave it: a laser and a UV
 * source on the register with a passing output check from now, and a lens for each laser-spot
 * factor asked (the tests' PDT orders type a factor of 1). `deviceFor(order)` is the `device` a
 * session start sends: the settings the order's plan asks for, and the lens for its factor.
 */
export async function readyBench(manager: Agent, lensFactors: number[] = [1]) {
  const laser = await addDevice(manager, 'laser');
  const uv = await addDevice(manager, 'uv');
  for (const [device, value] of [
    [laser, 100],
    [uv, 3],
  ] as const) {
    const res = await checkDevice(manager, device, value, value);
    if (res.status !== 201) throw new Error(`output check failed: ${JSON.stringify(res.body)}`);
  }
  const lenses = new Map<number, number>();
  for (const factor of lensFactors) {
    const res = await manager.post('/api/lenses').send({
      name: `Test lens ×${factor} ${randomUUID().slice(0, 6)}`,
      laserSpotFactor: factor,
      imageMagnification: factor,
    });
    if (res.status !== 201) throw new Error(`adding a lens failed: ${JSON.stringify(res.body)}`);
    lenses.set(factor, res.body.lens.id);
  }
  const deviceFor = (order: OrderForStart, overrides: Record<string, unknown> = {}) => {
    const { plan, inputs = {} } = order;
    if (plan.powerMw != null) {
      const lensId =
        inputs.lensId === undefined && inputs.lensMagnification !== undefined
          ? lenses.get(inputs.lensMagnification)
          : undefined;
      if (inputs.lensId === undefined && lensId === undefined)
        throw new Error(`readyBench has no lens of factor ${inputs.lensMagnification}`);
      return {
        deviceId: laser.id,
        powerSetMw: plan.powerMw,
        spotSetUm: plan.deviceSpotDiameterUm,
        ...(lensId === undefined ? {} : { lensId }),
        ...overrides,
      };
    }
    return { deviceId: uv.id, irradianceSetMwPerCm2: plan.irradianceMwPerCm2, ...overrides };
  };
  return { laser, uv, lenses, deviceFor };
}

/**
 * Fluence (J/cm²) of a laser power set over a round spot for a time: power ÷ (π (d/2)²) × time
 * (common practice). The tests' PDT plan sets 57.7 mW (0.1 mW steps) on a 3,500 µm spot, so 83 s
 * give 49.78 J/cm², a hair under the 49.8 J/cm² of 600 mW/cm² × 83 s (TAP Study Group, Arch
 * Ophthalmol 1999).
 */
export function fluenceFromPowerJPerCm2(powerMw: number, spotUm: number, seconds: number) {
  const areaCm2 = Math.PI * (spotUm / 2 / 10_000) ** 2;
  return ((powerMw / areaCm2) * seconds) / 1000;
}
