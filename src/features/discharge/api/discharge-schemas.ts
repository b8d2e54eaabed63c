import { z } from 'zod';
import { dosePlanSchema } from '../../../../shared/schemas/calculation';
import { orderStatuses } from '../../../../shared/schemas/orders';
import { eyes } from '../../../../shared/schemas/patients';

/** The discharge sheet as `GET /api/orders/:id/discharge` answers it (server/sessions/discharge.ts), as far as this screen reads it. */

const at = z.string().nullable().optional().default(null);
const figure = z.number().nullable().optional().default(null);

/** What was given, derived by the server from the session's events (shared/session/dose-record.ts). */
const givenSchema = z.object({
  kind: z.enum(['pdt', 'cxl']),
  outcome: z.enum(['not-started', 'in-progress', 'completed', 'stopped']),
  sessionStartedAt: at,
  endedAt: at,
  stopReason: at,
  infusionStartAt: at,
  infusionEndAt: at,
  infusionDurationS: figure,
  extravasationAt: at,
  lightStartAt: at,
  lightEndAt: at,
  lightOnS: figure,
  soakStartAt: at,
  soakEndAt: at,
  soakDurationS: figure,
  thicknessBeforeUvUm: figure,
  uvStartAt: at,
  uvEndAt: at,
  uvOnS: figure,
  deliveredFluenceJPerCm2: figure,
  volumeGivenMl: figure,
  volumeGivenSource: z.enum(['entered', 'derived']).nullable().optional().default(null),
  doseGivenMg: figure,
  plannedDoseMg: figure,
  deviceExposureS: figure,
});
export type GivenTreatment = z.infer<typeof givenSchema>;

export const dischargeSchema = z.object({
  unitName: z.string(),
  unitPhone: z.string(),
  unitTimeZone: z.string(),
  order: z.object({
    id: z.number().int(),
    revision: z.number().int(),
    eye: z.enum(eyes),
    status: z.enum(orderStatuses),
  }),
  patient: z.object({
    recordNumber: z.string(),
    givenName: z.string(),
    familyName: z.string(),
    dateOfBirth: z.string(),
    emailConsent: z.boolean(),
    hasEmail: z.boolean(),
  }),
  protocol: z.object({
    key: z.string(),
    version: z.number().int(),
    title: z.string(),
    kind: z.enum(['pdt', 'cxl']),
  }),
  plan: dosePlanSchema
    .pick({ doseMg: true, exposureS: true, uvTimeS: true, fluenceJPerCm2: true })
    .nullable(),
  record: givenSchema,
  precaution: z
    .object({
      endUtc: z.string(),
      endLocal: z.string(),
      /** Worded by the server, e.g. "Saturday 28 November 2026, 10:06 WET". */
      endLocalText: z.string(),
      hours: z.number(),
      source: z.string(),
      /** With no infusion start on record, the latest plausible time, and the note that says so. */
      basis: z.enum(['infusion-start', 'latest-plausible']).optional().default('infusion-start'),
      countedFrom: z.string().optional(),
      note: z.string().nullable().optional().default(null),
    })
    .nullable(),
  cautions: z.array(z.string()),
  /** Cautions answered yes at ordering, with the clinician's reason. */
  answeredCautions: z
    .array(z.object({ id: z.string(), question: z.string(), reason: z.string() }))
    .default([]),
});
export type Discharge = z.infer<typeof dischargeSchema>;

export const dischargeResponseSchema = z.object({ discharge: dischargeSchema });

export const dischargeEmailResponseSchema = z.object({ queued: z.literal(true) });
