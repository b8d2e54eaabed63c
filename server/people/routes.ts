import { createPersonSchema, updatePersonSchema } from '../../shared/schemas/people';
import { signedInUser } from '../auth/session';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import type { PeopleService } from './service';

export function peopleRoutes(people: PeopleService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/people',
      access: 'people.manage',
      handler: async (_req, res) => {
        res.json({ people: await people.list() });
      },
    },
    {
      method: 'post',
      path: '/people',
      access: 'people.manage',
      handler: async (req, res) => {
        const input = parseInput(createPersonSchema, req.body);
        const person = await people.create({ id: signedInUser(res).id, ipAddress: req.ip }, input);
        res.status(201).json({ person });
      },
    },
    {
      method: 'patch',
      path: '/people/:id',
      access: 'people.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const changes = parseInput(updatePersonSchema, req.body);
        const person = await people.update({ id: signedInUser(res).id, ipAddress: req.ip }, id, changes);
        res.json({ person });
      },
    },
  ];
}
