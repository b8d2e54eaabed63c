import type { RouteSpec } from '../http/route-table';
import type { HealthService } from './service';

export function healthRoutes(
  health: HealthService,
  unit: { name: string; timeZone: string; locale: string; phone: string },
): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/unit',
      access: 'public',
      // The unit's name, time zone, locale and telephone: not secret, and the client needs the zone before sign-in.
      handler: (_req, res) => {
        res.json(unit);
      },
    },
    {
      method: 'get',
      path: '/health',
      access: 'public',
      handler: async (_req, res) => {
        // Which process answered: lets operators and the fault tests tell instances apart.
        res.set('X-Luxtempo-Pid', String(process.pid));
        res.set('X-Luxtempo-Parent-Pid', String(process.ppid));
        const result = await health.check();
        res.status(result.status === 'ok' ? 200 : 503).json(result);
      },
    },
  ];
}
