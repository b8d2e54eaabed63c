import {
  adjustStockSchema,
  receiveStockSchema,
  recallQuerySchema,
} from '../../shared/schemas/stock';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import { actorOf } from '../orders/routes';
import type { StockService } from './service';

export function stockRoutes(stock: StockService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/stock',
      access: 'stock.read',
      handler: async (_req, res) => {
        res.json(await stock.lots());
      },
    },
    {
      method: 'post',
      path: '/stock',
      access: 'stock.manage',
      handler: async (req, res) => {
        res.status(201).json({
          lot: await stock.receive(actorOf(req, res), parseInput(receiveStockSchema, req.body)),
        });
      },
    },
    {
      method: 'get',
      path: '/stock/:id/movements',
      access: 'stock.read',
      handler: async (req, res) => {
        res.json(await stock.movements(parseInput(idParam, req.params.id, 'id')));
      },
    },
    {
      method: 'post',
      path: '/stock/:id/adjustments',
      access: 'stock.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.status(201).json({
          lot: await stock.adjust(actorOf(req, res), id, parseInput(adjustStockSchema, req.body)),
        });
      },
    },
    {
      method: 'get',
      path: '/recall',
      access: 'stock.recall',
      handler: async (req, res) => {
        const { lot } = parseInput(recallQuerySchema, req.query);
        res.json(await stock.recall(actorOf(req, res), lot));
      },
    },
    {
      method: 'get',
      path: '/recall.csv',
      access: 'stock.recall',
      handler: async (req, res) => {
        const { lot } = parseInput(recallQuerySchema, req.query);
        const lines = stock.recallCsv(actorOf(req, res), lot);
        const first = await lines.next();
        res.status(200).set({
          'Content-Type': 'text/csv; charset=utf-8',
          'Content-Disposition': `attachment; filename="recall-${lot.replace(/[^A-Za-z0-9.-]/g, '_')}.csv"`,
        });
        if (!first.done) res.write(first.value);
        for await (const line of lines) res.write(line);
        res.end();
      },
    },
    {
      method: 'post',
      path: '/recall/notifications',
      access: 'stock.recall',
      handler: async (req, res) => {
        const { lot } = parseInput(recallQuerySchema, req.body);
        res.status(201).json(await stock.notifyRecall(actorOf(req, res), lot));
      },
    },
    {
      method: 'get',
      path: '/reports/drug-use',
      access: 'stock.read',
      handler: async (_req, res) => {
        res.json(await stock.monthlyReport());
      },
    },
  ];
}
