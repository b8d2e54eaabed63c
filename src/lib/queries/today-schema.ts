import { z } from 'zod';
import { treatmentListSchema } from '../../../shared/schemas/lists';
import { orderSummarySchema } from '../../../shared/schemas/orders';

/** Today's answer (loaded by ./today.ts with the request). */
export const todayResponseSchema = z.object({
  lists: z.array(
    z.object({ id: z.string(), title: z.string(), orders: z.array(orderSummarySchema) }),
  ),
  /** Today's treatment lists, slots in time order (an older server sends none). */
  treatmentLists: z.array(treatmentListSchema).default([]),
  serverTime: z.string(),
});
