import { doseCheckSchema, preparationSchema } from '../../shared/schemas/orders';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import { actorOf } from '../orders/routes';
import type { PharmacyService } from './service';

export function pharmacyRoutes(pharmacy: PharmacyService): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/orders/:id/dose-checks',
      access: 'dose-checks.perform',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.status(201).json({
          order: await pharmacy.check(actorOf(req, res), id, parseInput(doseCheckSchema, req.body)),
        });
      },
    },
    {
      method: 'post',
      path: '/orders/:id/preparation',
      access: 'preparations.record',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.status(201).json({
          order: await pharmacy.prepare(
            actorOf(req, res),
            id,
            parseInput(preparationSchema, req.body),
          ),
        });
      },
    },
  ];
}
