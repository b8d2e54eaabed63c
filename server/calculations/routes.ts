import {
  calculationRequestSchema,
  lightCalculationRequestSchema,
} from '../../shared/schemas/calculation';
import type { RouteSpec } from '../http/route-table';
import { parseInput } from '../http/validation';
import type { CalculationService } from './service';

export function calculationRoutes(calculations: CalculationService): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/calculations',
      // A dose plan is for the people who write orders: a pharmacist with a blind check open could
      // otherwise get the figures they are meant to work out themselves. The light calculator
      // below stays open to everyone.
      access: 'orders.write',
      handler: async (req, res) => {
        res.json(await calculations.plan(parseInput(calculationRequestSchema, req.body)));
      },
    },
    {
      method: 'post',
      path: '/light-calculations',
      access: 'calculations.run',
      handler: (req, res) => {
        res.json(calculations.light(parseInput(lightCalculationRequestSchema, req.body)));
      },
    },
  ];
}
