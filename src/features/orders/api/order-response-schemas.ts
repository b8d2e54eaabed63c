import { z } from 'zod';
import { protocolKinds, protocolVersionSchema } from '../../../../shared/protocol/protocol-schema';
import { orderDetailSchema, orderSummarySchema } from '../../../../shared/schemas/orders';
import { patientSchema } from '../../../../shared/schemas/patients';

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
});
export type ProtocolVersionChoice = z.infer<typeof protocolVersionChoiceSchema>;

export const protocolChoicesResponseSchema = z.object({
  protocols: z.array(z.object({ key: z.string(), kind: z.enum(protocolKinds), title: z.string(), versions: z.array(protocolVersionChoiceSchema) })),
});
export type ProtocolChoices = z.infer<typeof protocolChoicesResponseSchema>['protocols'];

export const protocolDefinitionResponseSchema = z.object({
  version: protocolVersionChoiceSchema.extend({ definition: protocolVersionSchema }),
});
export type ProtocolVersionWithDefinition = z.infer<typeof protocolDefinitionResponseSchema>['version'];

export const patientsResponseSchema = z.object({ patients: z.array(patientSchema) });
export const patientResponseSchema = z.object({ patient: patientSchema });
