import { z } from 'zod';
import {
  auditFilterSchema,
  auditTrailQuerySchema,
  closeDeviationSchema,
  doseRecordFilterSchema,
  reopenDeviationSchema,
} from '../../shared/schemas/reviews';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import { actorOf } from '../orders/routes';
import type { ReviewService } from './service';

const trendsQuery = z.strictObject({
  from: z.iso.date({ error: 'from must be a date (YYYY-MM-DD)' }).optional(),
  to: z.iso.date({ error: 'to must be a date (YYYY-MM-DD)' }).optional(),
  protocol: z
    .string()
    .regex(/^[a-z0-9-]{1,64}$/, 'protocol must be a protocol key')
    .optional(),
});

function csvHeaders(res: Parameters<RouteSpec['handler']>[1], fileName: string) {
  res.status(200).set({
    'Content-Type': 'text/csv; charset=utf-8',
    'Content-Disposition': `attachment; filename="${fileName}"`,
  });
}

export function reviewRoutes(reviews: ReviewService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/deviations',
      access: 'audit.read',
      handler: async (req, res) => {
        res.json(await reviews.queue(parseInput(auditFilterSchema, req.query)));
      },
    },
    {
      method: 'get',
      path: '/deviations/:id',
      access: 'audit.read',
      handler: async (req, res) => {
        res.json(await reviews.detail(parseInput(idParam, req.params.id, 'id'), actorOf(req, res)));
      },
    },
    {
      method: 'post',
      path: '/deviations/:id/closure',
      access: 'audit.review',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.json(
          await reviews.close(actorOf(req, res), id, parseInput(closeDeviationSchema, req.body)),
        );
      },
    },
    {
      method: 'post',
      path: '/deviations/:id/reopening',
      access: 'audit.review',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.json(
          await reviews.reopen(
            actorOf(req, res),
            id,
            parseInput(reopenDeviationSchema, req.body).comment,
          ),
        );
      },
    },
    {
      method: 'get',
      path: '/dose-records',
      access: 'audit.read',
      handler: async (req, res) => {
        res.json(await reviews.doseRecords(parseInput(doseRecordFilterSchema, req.query)));
      },
    },
    {
      method: 'get',
      path: '/trends',
      access: 'audit.read',
      handler: async (req, res) => {
        const filter = parseInput(trendsQuery, req.query);
        const [months, byType] = await Promise.all([
          reviews.trends(filter),
          reviews.trendsByType(filter),
        ]);
        res.json({ months, byType });
      },
    },
    {
      method: 'get',
      path: '/exports/deviations.csv',
      access: 'audit.read',
      handler: async (req, res) => {
        const filter = parseInput(auditFilterSchema, req.query);
        csvHeaders(res, reviews.exportFileName('deviations'));
        await reviews.exportCsv('deviations', filter, res, actorOf(req, res));
      },
    },
    {
      method: 'get',
      path: '/exports/dose-records.csv',
      access: 'audit.read',
      handler: async (req, res) => {
        const filter = parseInput(doseRecordFilterSchema, req.query);
        csvHeaders(res, reviews.exportFileName('dose-records'));
        await reviews.exportCsv('dose-records', filter, res, actorOf(req, res));
      },
    },
    {
      method: 'get',
      path: '/audit-events',
      access: 'audit.read',
      handler: async (req, res) => {
        res.json(await reviews.auditTrail(parseInput(auditTrailQuerySchema, req.query)));
      },
    },
  ];
}
