import {
  amendOrderRequestSchema,
  orderDraftSchema,
  orderListQuerySchema,
  signOrderSchema,
  updateOrderSchema,
} from '../../shared/schemas/orders';
import { signedInUser } from '../auth/sign-in-session';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import type { Actor, OrderService } from './service';

export function actorOf(req: { ip?: string }, res: Parameters<typeof signedInUser>[0]): Actor {
  const user = signedInUser(res);
  return { id: user.id, roles: user.roles, ipAddress: req.ip };
}

export function orderRoutes(orders: OrderService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/orders',
      access: 'orders.read',
      handler: async (req, res) => {
        res.json(await orders.list(parseInput(orderListQuerySchema, req.query)));
      },
    },
    {
      method: 'post',
      path: '/orders',
      access: 'orders.write',
      handler: async (req, res) => {
        const input = parseInput(orderDraftSchema, req.body);
        res.status(201).json({ order: await orders.createDraft(actorOf(req, res), input) });
      },
    },
    {
      method: 'get',
      path: '/orders/:id',
      access: 'orders.read',
      handler: async (req, res) => {
        res.json({
          order: await orders.detail(parseInput(idParam, req.params.id, 'id'), actorOf(req, res)),
        });
      },
    },
    {
      method: 'put',
      path: '/orders/:id',
      access: 'orders.write',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const { version, ...draft } = parseInput(updateOrderSchema, req.body);
        res.json({ order: await orders.updateDraft(actorOf(req, res), id, draft, version) });
      },
    },
    {
      method: 'post',
      path: '/orders/:id/signature',
      access: 'orders.write',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const { password, version } = parseInput(signOrderSchema, req.body);
        res.json({ order: await orders.sign(actorOf(req, res), id, password, version) });
      },
    },
    {
      method: 'post',
      path: '/orders/:id/amendments',
      access: 'orders.write',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const { version, ...amendment } = parseInput(amendOrderRequestSchema, req.body);
        res
          .status(201)
          .json({ order: await orders.amend(actorOf(req, res), id, amendment, version) });
      },
    },
  ];
}
