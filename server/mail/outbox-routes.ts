import type { RouteSpec } from '../http/route-table';
import type { OutboxService } from './service';

export function outboxRoutes(outbox: OutboxService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/outbox',
      access: 'outbox.read',
      handler: async (_req, res) => {
        res.json(await outbox.recent());
      },
    },
  ];
}
