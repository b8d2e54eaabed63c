import type { RouteSpec } from '../http/route-table';
import type { PeopleService } from '../people/service';

/** The unit's staff for the auditor's filters: names and roles only, nothing that changes a person. */
export function staffRoutes(people: PeopleService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/staff',
      access: 'audit.read',
      handler: async (_req, res) => {
        res.json({ staff: await people.staff() });
      },
    },
  ];
}
