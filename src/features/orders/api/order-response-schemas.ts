import { z } from 'zod';
import type {
  ProtocolSummary,
  VersionDetail,
  VersionSummary,
} from '../../../lib/queries/protocol-schemas';
import { orderDetailSchema } from '../../../../shared/schemas/orders';

/** The shapes the order, protocol and patient APIs answer with, as this feature reads them. */

export {
  orderListResponseSchema,
  orderResponseSchema,
  type OrderListResponse,
} from '../../../lib/queries/orders';

export const attachmentSchema = orderDetailSchema.shape.attachments.element;
export type Attachment = z.infer<typeof attachmentSchema>;
export const attachmentResponseSchema = z.object({ attachment: attachmentSchema });

/** Protocols with their versions, as the form's protocol choice lists them. */
export type ProtocolChoices = ProtocolSummary[];
export type ProtocolVersionChoice = VersionSummary;
export type ProtocolVersionWithDefinition = VersionDetail;

/** What was given, derived by the server from the session's events (shared/session/dose-record.ts). */
export { givenRecordSchema, type GivenRecord } from '../../../lib/session-record-schemas';

/** `GET /api/orders/:id/session`, in the one shape every screen reads it: src/lib/queries/session-schema.ts. */
export {
  sessionDeviationSchema,
  sessionStateSchema as orderSessionResponseSchema,
  type SessionDeviation,
  type SessionState as OrderSession,
} from '../../../lib/queries/session-schema';
