import { computePlan } from '../../shared/engine/compute-plan';
import { solveLight } from '../../shared/engine/light-calculator';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import {
  calculationRequestSchema,
  lightCalculationRequestSchema,
} from '../../shared/schemas/calculation';
import type { RouteSpec } from '../http/route-table';
import { badInput, parseInput } from '../http/validation';
import type { ProtocolService } from '../protocols/service';

/** The engine refuses out-of-range input by throwing; here that becomes a 400 naming each field. */
function asBadRequest(error: unknown): never {
  if (error instanceof PlanInputError) throw badInput(error.fields);
  throw error;
}

export function calculationRoutes(protocols: ProtocolService): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/calculations',
      // A dose plan is for the people who write orders: a pharmacist with a blind check open could
      // otherwise get the figures they are meant to work out themselves. The light calculator
      // below stays open to everyone.
      access: 'orders.write',
      handler: async (req, res) => {
        const request = parseInput(calculationRequestSchema, req.body);
        const row = await protocols.resolveForPreview(
          request.protocol.key,
          request.protocol.version,
        );
        let plan;
        try {
          plan = computePlan(row.definition, request.inputs);
        } catch (error) {
          asBadRequest(error);
        }
        if (row.status !== 'approved') {
          plan.warnings.push({
            code: `protocol-${row.status}`,
            message: `Protocol ${row.key} version ${row.version} is ${row.status}: this plan is for review only and cannot be used for an order.`,
          });
        }
        res.json({
          plan,
          protocol: { key: row.key, version: row.version, status: row.status, sha256: row.sha256 },
        });
      },
    },
    {
      method: 'post',
      path: '/light-calculations',
      access: 'calculations.run',
      handler: (req, res) => {
        const request = parseInput(lightCalculationRequestSchema, req.body);
        try {
          res.json({ solution: solveLight(request) });
        } catch (error) {
          asBadRequest(error);
        }
      },
    },
  ];
}
