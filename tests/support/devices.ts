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
