import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../api-client';

/** One cache for the outbox: the e-mails waiting, sent or failed (the admin's screen). */

export const outboxStatuses = ['pending', 'sent', 'failed'] as const;
export type OutboxStatus = (typeof outboxStatuses)[number];

/** The shape server/mail/outbox-routes.ts answers with. */
const outboxMessageSchema = z.object({
  id: z.number(),
  kind: z.string(),
  recipients: z.array(z.string()),
  subject: z.string(),
  status: z.enum(outboxStatuses),
  attempts: z.number(),
  nextAttemptAt: z.string(),
  lastError: z.string().nullable(),
  sentAt: z.string().nullable(),
  createdAt: z.string(),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;

const outboxResponseSchema = z.object({ messages: z.array(outboxMessageSchema) });

export async function getOutboxMessages({ signal }: { signal?: AbortSignal } = {}): Promise<
  OutboxMessage[]
> {
  const { messages } = await api.get('/outbox', { schema: outboxResponseSchema, signal });
  return messages;
}

export const outboxKeys = {
  all: () => ['outbox'] as const,
  lists: () => [...outboxKeys.all(), 'list'] as const,
};

export const outboxListQuery = () =>
  queryOptions({
    queryKey: outboxKeys.lists(),
    queryFn: ({ signal }) => getOutboxMessages({ signal }),
  });
