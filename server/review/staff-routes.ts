import type { DataSource } from 'typeorm';
import type { RouteSpec } from '../http/route-table';

/**
 * Names and roles of the unit's staff for the auditor's filters. Only what a filter needs: no
 * e-mail addresses, nothing that changes a person.
 */
export function staffRoutes(dataSource: DataSource): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/staff',
      access: 'audit.read',
      handler: async (_req, res) => {
        const rows: { id: number; displayName: string; roles: string; active: number }[] =
          await dataSource.query(
            'SELECT id, display_name AS displayName, roles, active FROM user ORDER BY display_name',
          );
        res.json({
          staff: rows.map((r) => ({
            id: r.id,
            displayName: r.displayName,
            roles: r.roles ? r.roles.split(',') : [],
            active: Boolean(r.active),
          })),
        });
      },
    },
  ];
}
