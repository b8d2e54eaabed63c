import { z } from 'zod';
import { eyes } from '../../../shared/schemas/patients';
import { reviewClassifications, reviewStatuses } from '../../../shared/schemas/reviews';
import { deviationSeverities } from '../../../shared/session/session-events';
import {
  givenRecordSchema,
  protocolStepsSchema,
  type GivenRecord,
  type ProtocolSteps,
} from '../session-record-schemas';

export { protocolStepsSchema };
export type { GivenRecord, ProtocolSteps };

/** The shapes the review API answers with, as the deviations screens read them. */

const figure = z.number().nullable();

/*
 * A deviation type is kept as text: a type added on the server later still shows (by its key)
 * instead of making the whole page unreadable.
 */
export const deviationRowSchema = z.object({
  id: z.number().int(),
  orderId: z.number().int(),
  type: z.string(),
  severity: z.enum(deviationSeverities),
  expected: figure,
  actual: figure,
  unit: z.string().nullable(),
  message: z.string(),
  detectedAt: z.string(),
  reviewStatus: z.enum(reviewStatuses),
  classification: z.enum(reviewClassifications).nullable(),
  reviewedAt: z.string().nullable(),
  reviewedBy: z.string().nullable(),
  eye: z.enum(eyes),
  protocolKey: z.string(),
  protocolVersion: z.number().int(),
  protocolTitle: z.string(),
  recordNumber: z.string(),
});
export type DeviationRow = z.infer<typeof deviationRowSchema>;

export const deviationPageSchema = z.object({
  deviations: z.array(deviationRowSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type DeviationPage = z.infer<typeof deviationPageSchema>;

/** An event as stored: only the fields the timeline reads are checked. */
const sessionEventSchema = z.object({
  id: z.number().int(),
  idempotencyKey: z.string(),
  type: z.string(),
  clientTime: z.string(),
  /** When the server received it: for a late entry, when it was entered. */
  serverTime: z.string().optional(),
  stepId: z.string().optional(),
  thicknessUm: z.number().optional(),
  reason: z.string().optional(),
  note: z.string().optional(),
  withdrawnKey: z.string().optional(),
  lateEntryReason: z.string().optional(),
  volumeInfusedMl: z.number().optional(),
  exposureS: z.number().optional(),
  energyJ: z.number().optional(),
  authorisedByName: z.string().optional(),
  /** identity-confirmed: what was said again before the light; aftercare-checked: the item. */
  item: z.string().optional(),
});
export type StoredSessionEvent = z.infer<typeof sessionEventSchema>;

/** What was given, derived by the server from the events (shared/session/dose-record.ts). */

const sessionDeviationSchema = z.object({
  id: z.number().int(),
  type: z.string(),
  severity: z.enum(deviationSeverities),
  expected: figure,
  actual: figure,
  unit: z.string().nullable(),
  message: z.string(),
  detectedAt: z.string(),
});
export type SessionDeviation = z.infer<typeof sessionDeviationSchema>;

export const deviationDetailSchema = z.object({
  deviation: deviationRowSchema.pick({
    id: true,
    orderId: true,
    type: true,
    severity: true,
    expected: true,
    actual: true,
    unit: true,
    message: true,
    detectedAt: true,
    reviewStatus: true,
    classification: true,
    reviewedAt: true,
  }),
  history: z.array(
    z.object({
      action: z.enum(['closed', 'reopened']),
      classification: z.enum(reviewClassifications).nullable(),
      comment: z.string(),
      createdAt: z.string(),
      reviewer: z.string().nullable(),
    }),
  ),
  participants: z.array(
    z.object({ userId: z.number().int(), part: z.string(), displayName: z.string() }),
  ),
  session: z.object({
    status: z.string(),
    events: z.array(sessionEventSchema),
    record: givenRecordSchema.nullable(),
    deviations: z.array(sessionDeviationSchema),
  }),
  canReview: z.boolean(),
});
export type DeviationDetail = z.infer<typeof deviationDetailSchema>;

/** Only what the review reads from a protocol version: its steps (names, durations) and the CXL thickness minimum. */
