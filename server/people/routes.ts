import { createPersonSchema, updatePersonSchema } from '../../shared/schemas/people';
import { signedInUser } from '../auth/sign-in-session';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import type { PeopleService } from './service';

export function peopleRoutes(people: PeopleService): RouteSpec[] {
  const actorOf = (req: { ip?: string }, res: Parameters<typeof signedInUser>[0]) => ({
    id: signedInUser(res).id,
    ipAddress: req.ip,
  });
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
        const person = await people.create(actorOf(req, res), input);
        res.status(201).json({ person, passwordLink: 'sent' });
      },
    },
    {
      method: 'patch',
      path: '/people/:id',
      access: 'people.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const changes = parseInput(updatePersonSchema, req.body);
        const person = await people.update(actorOf(req, res), id, changes);
        res.json({ person });
      },
    },
    {
      method: 'post',
      path: '/people/:id/password-link',
      access: 'people.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        await people.sendPasswordLink(actorOf(req, res), id);
        // The link goes to the person only; the admin learns that it was sent.
        res.status(202).json({ passwordLink: 'sent' });
      },
    },
    {
      method: 'post',
      path: '/people/:id/sessions/end',
      access: 'people.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.json(await people.endSessions(actorOf(req, res), id));
      },
    },
    {
      method: 'get',
      path: '/role-requests',
      access: 'people.manage',
      handler: async (_req, res) => {
        res.json({ requests: await people.pendingRoleRequests() });
      },
    },
    {
      method: 'post',
      path: '/role-requests/:id/approval',
      access: 'people.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.json({ person: await people.decideRoleRequest(actorOf(req, res), id, 'approved') });
      },
    },
    {
      method: 'post',
      path: '/role-requests/:id/rejection',
      access: 'people.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.json({ person: await people.decideRoleRequest(actorOf(req, res), id, 'rejected') });
      },
    },
  ];
}
