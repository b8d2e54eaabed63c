import type { OutboxRepository } from './outbox-repository';

/** What the outbox page shows: the newest messages and how their delivery went. */
export function createOutboxService(outbox: OutboxRepository) {
  return {
    async recent() {
      const rows = await outbox.newest(200);
      return {
        messages: rows.map((m) => ({
          id: m.id,
          kind: m.kind,
          recipients: m.recipients,
          subject: m.subject,
          status: m.status,
          attempts: m.attempts,
          nextAttemptAt: m.nextAttemptAt.toISOString(),
          lastError: m.lastError,
          sentAt: m.sentAt?.toISOString() ?? null,
          createdAt: m.createdAt.toISOString(),
        })),
      };
    },
  };
}

export type OutboxService = ReturnType<typeof createOutboxService>;
