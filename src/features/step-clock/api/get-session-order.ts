import { z } from 'zod';
import { dosePlanSchema } from '../../../../shared/schemas/calculation';
import { orderDetailSchema, orderStatuses } from '../../../../shared/schemas/orders';
import { eyes } from '../../../../shared/schemas/patients';
import { api } from '../../../lib/api-client';

/** The parts of an order the bedside needs: who (with the date of birth), which eye, which protocol version, the plan. */
const sessionOrderSchema = z.object({
  id: z.number(),
  status: z.enum(orderStatuses),
  eye: z.enum(eyes),
  kind: z.enum(['pdt', 'cxl']),
  protocol: z.object({ key: z.string(), version: z.number(), title: z.string() }),
  patient: z.object({
    id: z.number(),
    recordNumber: z.string(),
    givenName: z.string(),
    familyName: z.string(),
    /** YYYY-MM-DD: the identity checks ask for it. */
    dateOfBirth: z.string(),
  }),
  plan: dosePlanSchema.nullable(),
  beyondUseAt: z.string().nullable(),
  answeredCautions: orderDetailSchema.shape.answeredCautions,
});
export type SessionOrder = z.infer<typeof sessionOrderSchema>;

const orderResponseSchema = z.object({ order: sessionOrderSchema });

export async function getSessionOrder(
  orderId: number,
  { signal }: { signal?: AbortSignal } = {},
): Promise<SessionOrder> {
  const { order } = await api.get(`/orders/${encodeURIComponent(String(orderId))}`, {
    schema: orderResponseSchema,
    signal,
  });
  return order;
}
