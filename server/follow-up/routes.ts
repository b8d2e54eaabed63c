import multer from 'multer';
import {
  outcomesQuerySchema,
  recordComplicationSchema,
  recordVisitSchema,
} from '../../shared/schemas/follow-up';
import { attachmentMaxBytes } from '../attachments/service';
import { AppError } from '../http/app-error';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import { actorOf } from '../orders/routes';
import type { OutcomeService } from './outcomes';
import type { FollowUpService } from './service';

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: attachmentMaxBytes, files: 1 },
}).single('file');

export function followUpRoutes(followUp: FollowUpService, outcomes: OutcomeService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/patients/:id/follow-up',
      access: 'patients.read',
      handler: async (req, res) => {
        res.json(await followUp.ofPatient(parseInput(idParam, req.params.id, 'id')));
      },
    },
    {
      method: 'post',
      path: '/follow-up-visits/:id',
      access: 'follow-up.record',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const input = parseInput(recordVisitSchema, req.body);
        res.json(await followUp.record(actorOf(req, res), id, input));
      },
    },
    {
      method: 'post',
      path: '/follow-up-visits/:id/attachments',
      access: 'follow-up.record',
      before: [upload],
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        if (!req.file)
          throw AppError.badRequest('Attach the report as the form field "file".', [
            { path: 'file', message: 'file is required (PDF, PNG or JPEG, up to 10 MB)' },
          ]);
        res
          .status(201)
          .json({ attachment: await followUp.attach(actorOf(req, res), id, req.file) });
      },
    },
    {
      method: 'get',
      path: '/follow-up/overdue',
      access: 'follow-up.record',
      handler: async (req, res) => {
        res.json({ visits: await followUp.overdue(actorOf(req, res).id) });
      },
    },
    {
      method: 'post',
      path: '/complications',
      access: 'follow-up.record',
      handler: async (req, res) => {
        const input = parseInput(recordComplicationSchema, req.body);
        res
          .status(201)
          .json({ complication: await followUp.addComplication(actorOf(req, res), input) });
      },
    },
    {
      method: 'get',
      path: '/complications/review-queue',
      access: 'audit.review',
      handler: async (_req, res) => {
        res.json({ complications: await followUp.reviewQueue() });
      },
    },
    {
      method: 'post',
      path: '/complications/:id/reviewed',
      access: 'audit.review',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.json({ complication: await followUp.markReviewed(actorOf(req, res), id) });
      },
    },
    {
      method: 'get',
      path: '/outcomes',
      access: 'outcomes.read',
      handler: async (req, res) => {
        res.json(await outcomes.outcomes(parseInput(outcomesQuerySchema, req.query)));
      },
    },
    {
      method: 'get',
      path: '/exports/outcomes.csv',
      access: 'outcomes.read',
      handler: async (req, res) => {
        const csv = await outcomes.outcomesCsv(parseInput(outcomesQuerySchema, req.query));
        res.status(200).set({
          'Content-Type': 'text/csv; charset=utf-8',
          'Content-Disposition': 'attachment; filename="luxtempo-outcomes.csv"',
        });
        res.send(csv);
      },
    },
  ];
}
