import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { outboxKeys } from '../../../lib/queries/outbox';

/** The shape GET /api/outbox/fhir answers with (server/fhir/routes.ts). */
const deliverySchema = z.object({
  id: z.number(),
  orderId: z.number(),
  version: z.number(),
  reason: z.string(),
  status: z.enum(['pending', 'sent', 'failed', 'superseded']),
  attempts: z.number(),
  nextAttemptAt: z.string(),
  lastError: z.string().nullable(),
  sentAt: z.string().nullable(),
  createdAt: z.string(),
});
export type FhirDelivery = z.infer<typeof deliverySchema>;

export const fhirDeliveriesQuery = () =>
  queryOptions({
    queryKey: [...outboxKeys.all(), 'fhir'] as const,
    queryFn: ({ signal }) =>
      api.get('/outbox/fhir', {
        schema: z.object({ enabled: z.boolean(), deliveries: z.array(deliverySchema) }),
        signal,
      }),
  });
