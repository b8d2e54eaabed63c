import { bookingSchema, createListSchema, listQuerySchema } from '../../shared/schemas/lists';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import { actorOf } from '../orders/routes';
import type { ListService } from './service';

export function listRoutes(lists: ListService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/lists',
      access: 'lists.read',
      handler: async (req, res) => {
        const query = parseInput(listQuerySchema, req.query);
        res.json(await lists.between(query.from, query.to));
      },
    },
    {
      method: 'post',
      path: '/lists',
      access: 'lists.manage',
      handler: async (req, res) => {
        res.status(201).json({
          list: await lists.create(actorOf(req, res), parseInput(createListSchema, req.body)),
        });
      },
    },
    {
      method: 'get',
      path: '/lists/:id',
      access: 'lists.read',
      handler: async (req, res) => {
        res.json({ list: await lists.get(parseInput(idParam, req.params.id, 'id')) });
      },
    },
    {
      method: 'post',
      path: '/lists/:id/bookings',
      access: 'lists.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.status(201).json({
          list: await lists.book(actorOf(req, res), id, parseInput(bookingSchema, req.body)),
        });
      },
    },
    {
      method: 'delete',
      path: '/bookings/:id',
      access: 'lists.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.json({ list: await lists.unbook(actorOf(req, res), id) });
      },
    },
    {
      method: 'get',
      path: '/lists/:id/vial-plan',
      access: 'stock.read',
      handler: async (req, res) => {
        res.json(await lists.vialPlan(parseInput(idParam, req.params.id, 'id')));
      },
    },
  ];
}
