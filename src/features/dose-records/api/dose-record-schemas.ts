import { z } from 'zod';
import { eyes } from '../../../../shared/schemas/patients';
import { deviationSeverities } from '../../../../shared/session/session-events';
import {
  givenRecordSchema,
  protocolStepsSchema,
  type GivenRecord,
  type ProtocolSteps,
} from '../../../lib/session-record-schemas';

export { protocolStepsSchema };
export type { GivenRecord, ProtocolSteps };

/** The shapes the dose-record, order, session and protocol APIs answer with, as these screens read them. */

const figure = z.number().nullable();

export const doseRecordRowSchema = z.object({
  orderId: z.number().int(),
  outcome: z.enum(['completed', 'stopped']),
  startedAt: z.string().nullable(),
  endedAt: z.string().nullable(),
  onTimeS: figure,
  deliveredFluenceJPerCm2: figure,
  plannedFluenceJPerCm2: figure,
  volumeGivenMl: figure,
  doseMg: figure,
  deviationCount: z.number().int(),
  eye: z.enum(eyes),
  protocolKey: z.string(),
  protocolVersion: z.number().int(),
  kind: z.enum(['pdt', 'cxl']),
  recordNumber: z.string(),
});
export type DoseRecordRow = z.infer<typeof doseRecordRowSchema>;

export const doseRecordPageSchema = z.object({
  records: z.array(doseRecordRowSchema),
  total: z.number().int(),
});
export type DoseRecordPage = z.infer<typeof doseRecordPageSchema>;

/** A tap as the printed record reads it: only pauses and resumes are drawn from the list. */
const sessionEventSchema = z.object({
  idempotencyKey: z.string(),
  type: z.string(),
  stepId: z.string().nullable().optional(),
  clientTime: z.string(),
});

export const sessionStateSchema = z.object({
  status: z.string(),
  record: givenRecordSchema.nullable(),
  events: z.array(sessionEventSchema).optional().default([]),
  /** Who ran the session at the bedside. */
  nurses: z.array(z.string()).optional().default([]),
  deviations: z.array(
    z.object({
      id: z.number().int(),
      type: z.string(),
      severity: z.enum(deviationSeverities),
      expected: figure,
      actual: figure,
      unit: z.string().nullable(),
      message: z.string(),
    }),
  ),
});
export type SessionState = z.infer<typeof sessionStateSchema>;

/** What the printed record reads from a protocol version: step durations and the CXL thickness minimum. */
