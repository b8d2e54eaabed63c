import { describe, expect, it } from 'vitest';
import { storedEventSchema } from '../../src/lib/queries/session-schema';

// A session start as the server stores and returns it: the nurse's input, the server's own
// fields, and what it found about the device (deviceRecord). Figures invented for the test.
const start = {
  idempotencyKey: '00000000-0000-4000-8000-000000000001',
  clientTime: '2026-03-02T09:00:00.000Z',
  type: 'session-started',
  checks: {
    patientIdentity: true,
    treatmentEye: true,
    consent: true,
    eyewear: true,
    deviceSettings: true,
  },
  device: { deviceId: 5, powerSetMw: 57.7, spotSetUm: 3500, lensId: 2 },
  deviceRecord: {
    deviceId: 5,
    name: 'Test laser',
    kind: 'laser',
    serialNumber: 'SN-1',
    outputCheckId: 9,
    outputCheckedAt: '2026-03-02T08:30:00.000Z',
    measuredIrradianceMwPerCm2: null,
    measuredFrom: null,
    lensId: 2,
    lensName: 'Test lens',
    laserSpotFactor: 1,
    laserSpotSetting: 'device-spot',
  },
  id: 224,
  serverTime: '2026-03-02T09:00:00.150Z',
  recordedBy: 2,
};

describe('a stored session start on the step clock', () => {
  it('reads the device, the lens named at the start and the server’s device record', () => {
    const parsed = storedEventSchema.safeParse(start);
    expect(parsed.success).toBe(true);
    expect(parsed.data).toMatchObject({
      device: { deviceId: 5, lensId: 2 },
      deviceRecord: { lensName: 'Test lens', laserSpotFactor: 1 },
    });
  });

  it('still refuses a field the event contract does not know', () => {
    expect(storedEventSchema.safeParse({ ...start, surprise: true }).success).toBe(false);
  });
});
