import {
  amendOrderRequestSchema,
  cancelOrderSchema,
  orderDraftSchema,
  orderListQuerySchema,
  signingFactsQuerySchema,
  signOrderSchema,
  updateOrderSchema,
} from '../../shared/schemas/orders';
import { signedInUser } from '../auth/sign-in-session';
import type { RouteSpec } from '../http/route-table';
import type { ZodType } from 'zod';
import { badInput, fieldProblemsFromZod, idParam, parseInput } from '../http/validation';
import type { Actor, OrderService } from './service';

export function actorOf(req: { ip?: string }, res: Parameters<typeof signedInUser>[0]): Actor {
  const user = signedInUser(res);
  return { id: user.id, roles: user.roles, ipAddress: req.ip };
}

/**
 * An order body parsed with its schema; when refused, the answer also carries what the engine
 * finds wrong with the other inputs, so the clinician sees every bad input of the form at once.
 */
async function parseOrderBody<T>(schema: ZodType<T>, body: unknown, orders: OrderService) {
  const parsed = schema.safeParse(body);
  if (parsed.success) return parsed.data;
  const fields = fieldProblemsFromZod(parsed.error);
  const engine = await orders.engineProblemsOf(
    body,
    fields.map((f) => f.path),
  );
  throw badInput([...fields, ...engine]);
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
        const input = await parseOrderBody(orderDraftSchema, req.body, orders);
        res.status(201).json({ order: await orders.createDraft(actorOf(req, res), input) });
      },
    },
    {
      // Before /orders/:id, which would take "signing-facts" for an id.
      method: 'get',
      path: '/orders/signing-facts',
      access: 'orders.write',
      handler: async (req, res) => {
        res.json(await orders.signingFacts(parseInput(signingFactsQuerySchema, req.query)));
      },
    },
    {
      // Before /orders/:id too. Identity only: an administrator holds this but not orders.read.
      method: 'get',
      path: '/orders/cancellable',
      access: 'orders.list-cancellable',
      handler: async (_req, res) => {
        res.json(await orders.listCancellable());
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
        const { version, ...draft } = await parseOrderBody(updateOrderSchema, req.body, orders);
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
        const { version, ...amendment } = await parseOrderBody(
          amendOrderRequestSchema,
          req.body,
          orders,
        );
        res
          .status(201)
          .json({ order: await orders.amend(actorOf(req, res), id, amendment, version) });
      },
    },
    {
      method: 'post',
      path: '/orders/:id/cancellation',
      access: 'orders.cancel',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const { reason, version } = parseInput(cancelOrderSchema, req.body);
        res.json({ order: await orders.cancel(actorOf(req, res), id, reason, version) });
      },
    },
  ];
}
