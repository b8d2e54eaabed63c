import { z } from 'zod';

// Shapes the auditor's screens read: what a session gave (the server's dose record,
// shared/session/dose-record.ts) and a protocol version's steps. One copy for every feature.

const maybeFigure = z.number().nullable().optional().default(null);
const maybeTime = z.string().nullable().optional().default(null);

/** A tap withdrawn as a mistake: kept in the record with its reason, counted in no figure. */
export const withdrawnTapSchema = z.object({
  idempotencyKey: z.string(),
  type: z.string(),
  stepId: z.string().nullable(),
  at: z.string(),
  withdrawnAt: z.string(),
  reason: z.string(),
});
export type WithdrawnTap = z.infer<typeof withdrawnTapSchema>;

/** A tap entered after the session ended, with its reason. */
export const lateEntrySchema = z.object({
  idempotencyKey: z.string(),
  type: z.string(),
  stepId: z.string().nullable(),
  at: z.string(),
  receivedAt: z.string().nullable(),
  reason: z.string(),
});
export type LateEntry = z.infer<typeof lateEntrySchema>;

/** A tap that reached the server more than a minute after it was made. */
export const receiptDelaySchema = z.object({
  idempotencyKey: z.string(),
  type: z.string(),
  stepId: z.string().nullable(),
  at: z.string(),
  receivedAt: z.string(),
  delayS: z.number(),
});
export type ReceiptDelay = z.infer<typeof receiptDelaySchema>;

/** What was given, derived by the server from the session's events. */
export const givenRecordSchema = z.object({
  kind: z.enum(['pdt', 'cxl']),
  outcome: z.enum(['not-started', 'in-progress', 'completed', 'stopped']),
  sessionStartedAt: maybeTime,
  endedAt: maybeTime,
  stopReason: z.string().nullable().optional().default(null),
  irradianceMwPerCm2: maybeFigure,
  infusionStartAt: maybeTime,
  infusionEndAt: maybeTime,
  infusionDurationS: maybeFigure,
  volumeGivenMl: maybeFigure,
  extravasationAt: maybeTime,
  lightStartAt: maybeTime,
  lightEndAt: maybeTime,
  lightStartAfterInfusionStartS: maybeFigure,
  lightOnS: maybeFigure,
  soakStartAt: maybeTime,
  soakEndAt: maybeTime,
  soakDurationS: maybeFigure,
  longestDropGapSoakS: maybeFigure,
  longestDropGapUvS: maybeFigure,
  thicknessBeforeUvUm: maybeFigure,
  thicknessOverrideReason: z.string().nullable().optional().default(null),
  uvStartAt: maybeTime,
  uvEndAt: maybeTime,
  uvElapsedS: maybeFigure,
  uvOnS: maybeFigure,
  deliveredFluenceJPerCm2: maybeFigure,
  // Records stored before withdrawals existed have none.
  withdrawnTaps: z.array(withdrawnTapSchema).optional().default([]),
  // Records stored before the session gates have none of these.
  volumeGivenSource: z.enum(['entered', 'derived']).nullable().optional().default(null),
  doseGivenMg: maybeFigure,
  plannedDoseMg: maybeFigure,
  deviceExposureS: maybeFigure,
  deviceEnergyJ: maybeFigure,
  lateEntries: z.array(lateEntrySchema).optional().default([]),
  receiptDelays: z.array(receiptDelaySchema).optional().default([]),
  // Records stored before the device register have none.
  deviceUsed: z
    .object({
      device: z
        .object({ id: z.number(), name: z.string(), kind: z.string(), serialNumber: z.string() })
        .nullable(),
      lens: z
        .object({
          id: z.number().nullable(),
          name: z.string().nullable(),
          laserSpotFactor: z.number(),
        })
        .nullable(),
      powerSetMw: z.number().nullable(),
      spotSetUm: z.number().nullable(),
      retinalSpotFromSettingUm: z.number().nullable(),
      irradianceSetMwPerCm2: z.number().nullable(),
      measuredIrradianceMwPerCm2: z.number().nullable(),
      fluenceIrradianceMwPerCm2: z.number().nullable(),
      fluenceBasis: z.enum(['measured', 'nominal', 'planned']),
    })
    .optional(),
});
export type GivenRecord = z.infer<typeof givenRecordSchema>;

/** A protocol version's steps, for naming steps on a timeline. */
export const protocolStepsSchema = z.object({
  version: z.object({
    key: z.string(),
    version: z.number().int(),
    title: z.string(),
    definition: z.object({
      steps: z.array(
        z.object({
          id: z.string(),
          kind: z.string(),
          title: z.string(),
          durationS: z.number().nullable(),
          cueEveryS: z.number().optional(),
        }),
      ),
      cxl: z.object({ minStromalThicknessUm: z.number() }).nullable().optional(),
    }),
  }),
});
export type ProtocolSteps = z.infer<typeof protocolStepsSchema>['version'];
