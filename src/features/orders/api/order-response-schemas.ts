import { z } from 'zod';
import {
  lateEntrySchema,
  receiptDelaySchema,
  withdrawnTapSchema,
} from '../../../lib/session-record-schemas';
import { protocolKinds, protocolVersionSchema } from '../../../../shared/protocol/protocol-schema';
import {
  orderDetailSchema,
  orderStatuses,
  orderSummarySchema,
} from '../../../../shared/schemas/orders';
import { patientSchema } from '../../../../shared/schemas/patients';
import { deviationSeverities } from '../../../../shared/session/session-events';

/** The shapes the order, protocol and patient APIs answer with, as this feature reads them. */

export const orderListResponseSchema = z.object({
  orders: z.array(orderSummarySchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type OrderListResponse = z.infer<typeof orderListResponseSchema>;

export const orderResponseSchema = z.object({ order: orderDetailSchema });

export const attachmentSchema = orderDetailSchema.shape.attachments.element;
export type Attachment = z.infer<typeof attachmentSchema>;
export const attachmentResponseSchema = z.object({ attachment: attachmentSchema });

const protocolVersionChoiceSchema = z.object({
  key: z.string(),
  version: z.number().int(),
  kind: z.enum(protocolKinds),
  title: z.string(),
  status: z.string(),
  /** The newer approved version that supersedes this one (derived by the server); null when newest. */
  supersededBy: z.number().int().nullable().optional().default(null),
});
export type ProtocolVersionChoice = z.infer<typeof protocolVersionChoiceSchema>;

export const protocolChoicesResponseSchema = z.object({
  protocols: z.array(
    z.object({
      key: z.string(),
      kind: z.enum(protocolKinds),
      title: z.string(),
      versions: z.array(protocolVersionChoiceSchema),
    }),
  ),
});
export type ProtocolChoices = z.infer<typeof protocolChoicesResponseSchema>['protocols'];

export const protocolDefinitionResponseSchema = z.object({
  version: protocolVersionChoiceSchema.extend({ definition: protocolVersionSchema }),
});
export type ProtocolVersionWithDefinition = z.infer<
  typeof protocolDefinitionResponseSchema
>['version'];

export const patientsResponseSchema = z.object({ patients: z.array(patientSchema) });
export const patientResponseSchema = z.object({ patient: patientSchema });

const at = z.string().nullable().optional().default(null);
const figure = z.number().nullable().optional().default(null);

/** What was given, derived by the server from the session's events (shared/session/dose-record.ts). */
export const givenRecordSchema = z.object({
  kind: z.enum(protocolKinds),
  outcome: z.enum(['not-started', 'in-progress', 'completed', 'stopped']),
  sessionStartedAt: at,
  endedAt: at,
  stopReason: at,
  irradianceMwPerCm2: figure,
  infusionStartAt: at,
  infusionEndAt: at,
  infusionDurationS: figure,
  volumeGivenMl: figure,
  extravasationAt: at,
  lightStartAt: at,
  lightEndAt: at,
  lightStartAfterInfusionStartS: figure,
  lightOnS: figure,
  soakStartAt: at,
  soakEndAt: at,
  soakDurationS: figure,
  longestDropGapSoakS: figure,
  longestDropGapUvS: figure,
  thicknessBeforeUvUm: figure,
  thicknessOverrideReason: at,
  uvStartAt: at,
  uvEndAt: at,
  uvElapsedS: figure,
  uvOnS: figure,
  deliveredFluenceJPerCm2: figure,
  // Records stored before withdrawals existed have none.
  withdrawnTaps: z.array(withdrawnTapSchema).optional().default([]),
  // Records stored before the session gates have none of these.
  volumeGivenSource: z.enum(['entered', 'derived']).nullable().optional().default(null),
  doseGivenMg: figure,
  plannedDoseMg: figure,
  deviceExposureS: figure,
  deviceEnergyJ: figure,
  lateEntries: z.array(lateEntrySchema).optional().default([]),
  receiptDelays: z.array(receiptDelaySchema).optional().default([]),
});
export type GivenRecord = z.infer<typeof givenRecordSchema>;

export const sessionDeviationSchema = z.object({
  id: z.number().int(),
  type: z.string(),
  severity: z.enum(deviationSeverities),
  expected: z.number().nullable(),
  actual: z.number().nullable(),
  unit: z.string().nullable(),
  message: z.string(),
  detectedAt: z.string(),
});
export type SessionDeviation = z.infer<typeof sessionDeviationSchema>;

/** `GET /api/orders/:id/session`: the record is null until the first event is stored. */
export const orderSessionResponseSchema = z.object({
  status: z.enum(orderStatuses),
  record: givenRecordSchema.nullable(),
  deviations: z.array(sessionDeviationSchema),
  serverTime: z.string(),
});
export type OrderSession = z.infer<typeof orderSessionResponseSchema>;
