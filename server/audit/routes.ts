import type { RouteSpec } from '../http/route-table';
import type { AuditService } from './service';

export function auditRoutes(service: AuditService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/audit-chain',
      access: 'audit.verify',
      handler: async (_req, res) => {
        res.json(await service.verifyChain());
      },
    },
  ];
}
