import type { DataSource } from 'typeorm';
import { OutboxMessage } from '../db/entities/outbox-message';
import type { RouteSpec } from '../http/route-table';

export function outboxRoutes(dataSource: DataSource): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/outbox',
      access: 'outbox.read',
      handler: async (_req, res) => {
        const rows = await dataSource
          .getRepository(OutboxMessage)
          .find({ order: { id: 'DESC' }, take: 200 });
        res.json({
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
        });
      },
    },
  ];
}
