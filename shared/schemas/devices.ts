import { z } from 'zod';

export const deviceKinds = ['laser', 'uv'] as const;
export type DeviceKind = (typeof deviceKinds)[number];
export const deviceStatuses = ['in-use', 'out-of-service'] as const;
export type DeviceStatus = (typeof deviceStatuses)[number];

/** Bounds of what can be typed for a device (what any eye laser or UV source could be, not a clinical limit). */
export const deviceFigureLimits = {
  wavelengthNm: { min: 200, max: 1200 },
  powerMw: { min: 0.1, max: 5000 },
  spotUm: { min: 50, max: 12_000 },
  irradianceMwPerCm2: { min: 0.1, max: 2000 },
  laserSpotFactor: { min: 0.5, max: 2.5 },
  imageMagnification: { min: 0.1, max: 5 },
} as const;
type FigureField = keyof typeof deviceFigureLimits;

function figure(field: string, limit: FigureField, unit: string) {
  const { min, max } = deviceFigureLimits[limit];
  const message = `${field} must be a number from ${min} to ${max} ${unit}`.trimEnd();
  return z.number({ error: message }).min(min, message).max(max, message);
}

const text = (field: string, max: number) =>
  z
    .string({ error: `${field} is required` })
    .trim()
    .min(1, `${field} must be 1 to ${max} characters`)
    .max(max, `${field} must be 1 to ${max} characters`);

const isoDate = (field: string) => z.iso.date({ error: `${field} must be a date (YYYY-MM-DD)` });

function range(field: string, limit: FigureField, unit: string) {
  return z
    .strictObject({
      min: figure(`${field}.min`, limit, unit),
      max: figure(`${field}.max`, limit, unit),
    })
    .refine((r) => r.min <= r.max, {
      message: `${field}.min must not exceed ${field}.max`,
      path: ['min'],
    });
}

/** A device as the admin or device lead saves it: its own facts, the ranges it can be set to, and its status. */
export const deviceInputSchema = z
  .strictObject({
    name: text('name', 80),
    kind: z.enum(deviceKinds, { error: `kind must be one of ${deviceKinds.join(', ')}` }),
    wavelengthNm: figure('wavelengthNm', 'wavelengthNm', 'nm'),
    serialNumber: text('serialNumber', 60),
    location: text('location', 80),
    /** A laser: the power and spot it can be set to. Null for a UV source. */
    powerRangeMw: range('powerRangeMw', 'powerMw', 'mW').nullable(),
    spotRangeUm: range('spotRangeUm', 'spotUm', 'µm').nullable(),
    /** A UV source: the irradiance it can be set to at the treatment distance. Null for a laser. */
    irradianceRangeMwPerCm2: range(
      'irradianceRangeMwPerCm2',
      'irradianceMwPerCm2',
      'mW/cm²',
    ).nullable(),
    pulsedAvailable: z.boolean({ error: 'pulsedAvailable must be true or false' }),
    serviceDueOn: isoDate('serviceDueOn'),
    status: z.enum(deviceStatuses, {
      error: `status must be one of ${deviceStatuses.join(', ')}`,
    }),
    /** Required when the device is out of service. */
    outOfServiceReason: text('outOfServiceReason', 500).nullable().default(null),
  })
  .superRefine((d, ctx) => {
    const need = (path: keyof typeof d, present: boolean, message: string) => {
      if (!present) ctx.addIssue({ code: 'custom', path: [path], message });
    };
    if (d.kind === 'laser') {
      need('powerRangeMw', d.powerRangeMw !== null, 'powerRangeMw is required for a laser');
      need('spotRangeUm', d.spotRangeUm !== null, 'spotRangeUm is required for a laser');
      need(
        'irradianceRangeMwPerCm2',
        d.irradianceRangeMwPerCm2 === null,
        'irradianceRangeMwPerCm2 must be null for a laser (its power and spot are set)',
      );
    } else {
      need(
        'irradianceRangeMwPerCm2',
        d.irradianceRangeMwPerCm2 !== null,
        'irradianceRangeMwPerCm2 is required for a UV source',
      );
      need('powerRangeMw', d.powerRangeMw === null, 'powerRangeMw must be null for a UV source');
      need('spotRangeUm', d.spotRangeUm === null, 'spotRangeUm must be null for a UV source');
    }
    need(
      'outOfServiceReason',
      (d.status === 'out-of-service') === (d.outOfServiceReason !== null),
      d.status === 'out-of-service'
        ? 'outOfServiceReason is required when the device is out of service'
        : 'outOfServiceReason must be null while the device is in use',
    );
  });
export type DeviceInput = z.infer<typeof deviceInputSchema>;

/** A change to a device names the version it was made on (a stale screen is refused) and why. */
export const deviceChangeSchema = z.strictObject({
  version: z.number({ error: 'version must be the device version you changed' }).int().positive(),
  reason: text('reason', 500).refine((r) => r.length >= 5, 'reason must be 5 to 500 characters'),
  device: deviceInputSchema,
});
export type DeviceChange = z.infer<typeof deviceChangeSchema>;

export const lensInputSchema = z.strictObject({
  name: text('name', 80),
  /** Device spot = retinal spot ÷ this factor [common practice]. */
  laserSpotFactor: figure('laserSpotFactor', 'laserSpotFactor', '(a factor)'),
  /** The image magnification, shown apart: never used for the spot. */
  imageMagnification: figure('imageMagnification', 'imageMagnification', '(a factor)'),
});
export type LensInput = z.infer<typeof lensInputSchema>;

/**
 * An output check: the value set on the device and what the meter read. A laser is checked in
 * power (mW), a UV source in irradiance at the treatment distance (mW/cm²); the fields carry the
 * unit, so a figure in the wrong quantity cannot pass as the other.
 */
export const outputCheckInputSchema = z.strictObject({
  powerSetMw: figure('powerSetMw', 'powerMw', 'mW').optional(),
  powerMeasuredMw: figure('powerMeasuredMw', 'powerMw', 'mW').optional(),
  irradianceSetMwPerCm2: figure('irradianceSetMwPerCm2', 'irradianceMwPerCm2', 'mW/cm²').optional(),
  irradianceMeasuredMwPerCm2: figure(
    'irradianceMeasuredMwPerCm2',
    'irradianceMwPerCm2',
    'mW/cm²',
  ).optional(),
  meterIdentity: text('meterIdentity', 80),
  meterCalibrationDueOn: isoDate('meterCalibrationDueOn'),
  /** The order the check is made for, from the step clock's pre-checks: its protocol's tolerance judges it. */
  orderId: z.number({ error: 'orderId must be an order id' }).int().positive().optional(),
  note: text('note', 500).optional(),
});
export type OutputCheckInput = z.infer<typeof outputCheckInputSchema>;

/** What the nurse set on the device for this session, sent with the session's start. */
export const deviceSettingSchema = z.strictObject({
  deviceId: z.number({ error: 'device.deviceId must be a device id' }).int().positive(),
  /** PDT: the laser's power and spot as set. */
  powerSetMw: figure('device.powerSetMw', 'powerMw', 'mW').optional(),
  spotSetUm: figure('device.spotSetUm', 'spotUm', 'µm').optional(),
  /** CXL: the UV irradiance set, and (if read just now at the treatment distance) measured. */
  irradianceSetMwPerCm2: figure(
    'device.irradianceSetMwPerCm2',
    'irradianceMwPerCm2',
    'mW/cm²',
  ).optional(),
  irradianceMeasuredMwPerCm2: figure(
    'device.irradianceMeasuredMwPerCm2',
    'irradianceMwPerCm2',
    'mW/cm²',
  ).optional(),
  /**
   * PDT: the contact lens on the eye, from the lens register. Needed when the order names no lens
   * (its factor was typed); its laser-spot factor must be the one the plan was worked out with.
   */
  lensId: z
    .number({ error: 'device.lensId must be the id of a lens on the register' })
    .int('device.lensId must be the id of a lens on the register')
    .positive('device.lensId must be the id of a lens on the register')
    .optional(),
});
export type DeviceSetting = z.infer<typeof deviceSettingSchema>;

/** Why a device cannot start a session now; empty when it can. */
export const deviceBlockKinds = [
  'out-of-service',
  'service-overdue',
  'no-check',
  'check-failed',
  'check-stale',
] as const;
export type DeviceBlockKind = (typeof deviceBlockKinds)[number];
export interface DeviceBlock {
  kind: DeviceBlockKind;
  message: string;
}
