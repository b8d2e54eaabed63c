import { sessionEventSchema } from '../../shared/session/session-events';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import { actorOf } from '../orders/routes';
import type { DischargeService } from './discharge';
import type { SessionService } from './service';

export function sessionRoutes(sessions: SessionService, discharge: DischargeService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/orders/:id/session',
      access: 'orders.read',
      handler: async (req, res) => {
        res.json(await sessions.state(parseInput(idParam, req.params.id, 'id')));
      },
    },
    {
      method: 'post',
      path: '/orders/:id/session-events',
      access: 'sessions.run',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const result = await sessions.record(
          actorOf(req, res),
          id,
          parseInput(sessionEventSchema, req.body),
        );
        res.status(result.replayed ? 200 : 201).json(result);
      },
    },
    {
      method: 'get',
      path: '/orders/:id/discharge',
      access: 'orders.read',
      handler: async (req, res) => {
        res.json({ discharge: await discharge.sheet(parseInput(idParam, req.params.id, 'id')) });
      },
    },
    {
      method: 'post',
      path: '/orders/:id/discharge-email',
      access: 'sessions.run',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.status(202).json(await discharge.email(actorOf(req, res), id));
      },
    },
  ];
}
