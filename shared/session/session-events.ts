import { z } from 'zod';
import { deviceSettingSchema } from '../schemas/devices';

/**
 * Everything a nurse taps during a session is one of these events. Each is stored once (its
 * client-made idempotency key is unique), never changed, and the session's dose record, clock and
 * deviations are all derived from the list of events.
 */
export const sessionEventTypes = [
  'session-started',
  'step-started',
  'step-ended',
  'paused',
  'resumed',
  'drop-given',
  'thickness-measured',
  'thickness-override',
  'extravasation',
  'exposure-recorded',
  'session-stopped',
  'session-completed',
  'tap-withdrawn',
  'identity-confirmed',
  'aftercare-checked',
] as const;
export type SessionEventType = (typeof sessionEventTypes)[number];

/**
 * Taps that mark the session's own beginning and end cannot be withdrawn: they change the order's
 * status and start or close its record, so undoing them would leave a status no tap explains. A
 * withdrawal cannot itself be withdrawn either (a correction of a correction is a new tap).
 */
const notWithdrawable: ReadonlySet<SessionEventType> = new Set([
  'session-started',
  'session-completed',
  'session-stopped',
  'tap-withdrawn',
]);
export const isWithdrawableType = (type: SessionEventType): boolean => !notWithdrawable.has(type);

/** The pre-treatment checks, each confirmed aloud and ticked before the clock starts. */
export const preTreatmentChecks = [
  'patientIdentity',
  'treatmentEye',
  'consent',
  'eyewear',
  'deviceSettings',
] as const;
export type PreTreatmentCheck = (typeof preTreatmentChecks)[number];

/**
 * Said again at the bedside just before the light or UV starts (the protocol's "identity and eye
 * again before the light"): the server refuses that start without them.
 */
export const identityChecks = ['patientName', 'dateOfBirth', 'treatmentEye'] as const;
export type IdentityCheck = (typeof identityChecks)[number];

/** The after-care step's checklist; the discharge sheet is either printed or e-mailed. */
export const aftercareItems = [
  'advice',
  'sheet-printed',
  'sheet-emailed',
  'contact-number',
] as const;
export type AftercareItem = (typeof aftercareItems)[number];

/**
 * A tap the nurse missed can be entered afterwards at its real time, with the reason it is late:
 * these kinds only (a pause, a stop or a withdrawal is recorded when it happens).
 */
export const lateEntryTypes = [
  'step-started',
  'step-ended',
  'drop-given',
  'thickness-measured',
] as const satisfies readonly SessionEventType[];
export const isLateEntryType = (type: SessionEventType): boolean =>
  (lateEntryTypes as readonly SessionEventType[]).includes(type);

const stepId = z
  .string({ error: 'stepId is required' })
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'stepId must be a step id of the protocol')
  .max(64);
const reason = (field: string) =>
  z
    .string({ error: `${field} is required` })
    .trim()
    .min(5, `${field} must be 5 to 500 characters`)
    .max(500, `${field} must be 5 to 500 characters`);

/** Bounds of the figures a nurse types in at the bedside (device and pump ranges, not clinical limits). */
export const enteredFigureLimits = {
  volumeInfusedMl: { min: 0, max: 1000 },
  exposureS: { min: 0.1, max: 3600 },
  energyJ: { min: 0, max: 1000 },
} as const;

function boundedNumber(field: keyof typeof enteredFigureLimits, unit: string) {
  const { min, max } = enteredFigureLimits[field];
  const message = `${field} must be a number from ${min} to ${max} ${unit}`;
  return z.number({ error: message }).min(min, message).max(max, message);
}

const common = {
  /** Made by the client (a UUID) so a retried send is recognised and stored only once. */
  idempotencyKey: z.uuid({ error: 'idempotencyKey must be a UUID' }),
  /** The moment of the tap by the client's clock, corrected by its measured server offset. */
  clientTime: z.iso.datetime({
    offset: true,
    error: 'clientTime must be an ISO 8601 date-time with offset',
  }),
  /**
   * A tap timed after the session ended is taken only as a late entry, with the reason it is
   * entered late; it is shown as a late entry everywhere (the server decides, see lateTapRule).
   */
  lateEntryReason: reason('lateEntryReason').optional(),
};

export const sessionEventSchema = z.discriminatedUnion(
  'type',
  [
    z.strictObject({
      ...common,
      type: z.literal('session-started'),
      checks: z.strictObject(
        Object.fromEntries(
          preTreatmentChecks.map((c) => [
            c,
            z.literal(true, {
              error: `checks.${c} must be confirmed (true) before the session starts`,
            }),
          ]),
        ) as Record<PreTreatmentCheck, z.ZodLiteral<true>>,
        { error: `checks must confirm ${preTreatmentChecks.join(', ')}` },
      ),
      /**
       * The device chosen and what was set on it (required by the server for protocol versions
       * with deviceChecks; optional in the shape so that starts stored before it still read).
       */
      device: deviceSettingSchema.optional(),
    }),
    z.strictObject({ ...common, type: z.literal('step-started'), stepId }),
    z.strictObject({
      ...common,
      type: z.literal('step-ended'),
      stepId,
      /** Why a timed dose step ends far short of its time (required by the server then, see shortEndVerdict). */
      reason: reason('reason').optional(),
    }),
    z.strictObject({ ...common, type: z.literal('paused'), stepId }),
    z.strictObject({ ...common, type: z.literal('resumed'), stepId }),
    z.strictObject({ ...common, type: z.literal('drop-given'), stepId }),
    z.strictObject({
      ...common,
      type: z.literal('thickness-measured'),
      stepId,
      thicknessUm: z
        .number({ error: 'thicknessUm must be a number in µm' })
        .min(100, 'thicknessUm must be between 100 and 900 µm')
        .max(900, 'thicknessUm must be between 100 and 900 µm'),
    }),
    z.strictObject({
      ...common,
      type: z.literal('thickness-override'),
      reason: reason('reason'),
      /**
       * UV below the minimum needs a second person: a clinician, not the nurse, types their e-mail
       * and password on the tablet. The server checks them and stores who authorised it
       * (authorisedById, authorisedByName), never the password. Optional in the shape only so
       * that events stored before this rule still read; the server refuses a new override without them.
       */
      authoriserEmail: z
        .email({
          error: 'authoriserEmail must be the e-mail of the clinician who authorises the override',
        })
        .max(254)
        .optional(),
      authoriserPassword: z
        .string({ error: 'authoriserPassword must be text' })
        .min(1, 'authoriserPassword is required')
        .max(200, 'authoriserPassword must be at most 200 characters')
        .optional(),
    }),
    z.strictObject({
      ...common,
      type: z.literal('extravasation'),
      note: z.string().trim().max(500, 'note must be at most 500 characters').optional(),
      /** What the pump shows as infused when the leak is found (PDT: required by the server, at most the final volume). */
      volumeInfusedMl: boundedNumber('volumeInfusedMl', 'mL').optional(),
    }),
    /** The exposure time (and energy) the laser displays at the end of the light step: the figure the exposure is judged on. */
    z.strictObject({
      ...common,
      type: z.literal('exposure-recorded'),
      stepId,
      exposureS: boundedNumber('exposureS', 's'),
      energyJ: boundedNumber('energyJ', 'J').optional(),
    }),
    z.strictObject({
      ...common,
      type: z.literal('session-stopped'),
      reason: reason('reason'),
      /** What the pump shows as infused when a PDT session stops (required by the server once an infusion started). */
      volumeInfusedMl: boundedNumber('volumeInfusedMl', 'mL').optional(),
    }),
    z.strictObject({ ...common, type: z.literal('session-completed') }),
    z.strictObject({
      ...common,
      type: z.literal('tap-withdrawn'),
      /** The idempotency key of the mistaken tap; that tap stays stored, and every replay skips it. */
      withdrawnKey: z.uuid({ error: 'withdrawnKey must be a UUID' }),
      reason: reason('reason'),
    }),
    /** Patient identity (name and date of birth) and eye said again before the light or UV step `stepId` starts. */
    z.strictObject({
      ...common,
      type: z.literal('identity-confirmed'),
      stepId,
      checks: z.strictObject(
        Object.fromEntries(
          identityChecks.map((c) => [
            c,
            z.literal(true, {
              error: `checks.${c} must be confirmed (true) before the light starts`,
            }),
          ]),
        ) as Record<IdentityCheck, z.ZodLiteral<true>>,
        { error: `checks must confirm ${identityChecks.join(', ')}` },
      ),
    }),
    z.strictObject({
      ...common,
      type: z.literal('aftercare-checked'),
      stepId,
      item: z.enum(aftercareItems, {
        error: `item must be one of ${aftercareItems.join(', ')}`,
      }),
    }),
  ],
  { error: `type must be one of ${sessionEventTypes.join(', ')}` },
);
export type SessionEventInput = z.infer<typeof sessionEventSchema>;

/** An event as stored: the input plus who recorded it and the server's own time. */
export type SessionEvent = SessionEventInput & {
  id: number;
  /** When the server received it (the tablet's own time is clientTime). */
  serverTime: string;
  recordedBy: number;
  /** A thickness override: the clinician whose password authorised it (the password is never stored). */
  authorisedById?: number;
  authorisedByName?: string;
  /** A session start: the device, its output check and the lens, as the server found them. */
  deviceRecord?: DeviceRecord;
};

/**
 * What the server adds to a session start about the device: which one, the output check that let
 * it start, the irradiance measured (CXL) and the lens whose factor turned the retinal spot into
 * the laser's setting (PDT).
 */
export interface DeviceRecord {
  deviceId: number;
  name: string;
  kind: 'laser' | 'uv';
  serialNumber: string;
  outputCheckId: number;
  outputCheckedAt: string;
  /** CXL: the irradiance measured at the treatment distance, and where the figure comes from. */
  measuredIrradianceMwPerCm2: number | null;
  measuredFrom: 'entered' | 'output-check' | null;
  lensId: number | null;
  lensName: string | null;
  laserSpotFactor: number | null;
  /** What the laser's spot setting means (the protocol's deviceChecks.laserSpotSetting). */
  laserSpotSetting: 'retinal-spot' | 'device-spot' | null;
}

/** Fields the server adds to a stored event's payload; a client takes them off before checking it against the contract. */
export const serverAddedEventFields = [
  'authorisedById',
  'authorisedByName',
  'deviceRecord',
] as const;

export const deviationSeverities = ['minor', 'major', 'critical'] as const;
export type DeviationSeverity = (typeof deviationSeverities)[number];

export const deviationTypes = [
  'infusion-duration',
  'light-start-window',
  'exposure-time',
  'delivered-fluence',
  'beyond-use',
  'reconstitution-to-infusion',
  'light-without-infusion',
  'soak-short',
  'drop-gap',
  'uv-below-thickness',
  'thickness-override',
  'extravasation',
  'stopped-early',
  'contraindication-override',
  'device-setting',
] as const;
export type DeviationType = (typeof deviationTypes)[number];

export interface Deviation {
  type: DeviationType;
  severity: DeviationSeverity;
  /** What the protocol expected and what happened, as numbers in `unit` where that makes sense. */
  expected: number | null;
  actual: number | null;
  unit: string | null;
  message: string;
  /**
   * When the event that caused it happened (the infusion's end, the light's start…), from the
   * taps that still count: a withdrawn tap never lends its time to a deviation that another
   * event causes. Null when no event of the session caused it.
   */
  at: string | null;
}
