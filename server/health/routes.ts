import type { DataSource } from 'typeorm';
import type { RouteSpec } from '../http/route-table';

export function healthRoutes(
  dataSource: DataSource,
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
        const started = performance.now();
        try {
          await dataSource.query('SELECT 1');
          res.json({
            status: 'ok',
            database: {
              status: 'up',
              latencyMs: Math.round((performance.now() - started) * 10) / 10,
            },
          });
        } catch {
          res.status(503).json({ status: 'degraded', database: { status: 'down' } });
        }
      },
    },
  ];
}
