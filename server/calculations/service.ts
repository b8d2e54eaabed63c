import { computePlan } from '../../shared/engine/compute-plan';
import { solveLight } from '../../shared/engine/light-calculator';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import type { ProtocolVersion as ProtocolDefinition } from '../../shared/protocol/protocol-schema';
import type {
  CalculationRequest,
  DosePlan,
  LightCalculationRequest,
} from '../../shared/schemas/calculation';
import { badInput } from '../http/validation';
import type { ProtocolService } from '../protocols/service';

/** Runs the engine; its refusal of out-of-range input becomes a 400 naming each field. */
function engine<T>(run: () => T): T {
  try {
    return run();
  } catch (error) {
    if (error instanceof PlanInputError) throw badInput(error.fields);
    throw error;
  }
}

/** The engine's dose plan for a protocol definition, or a 400 naming the inputs it refused. */
export function planFromEngine(
  definition: ProtocolDefinition,
  inputs: CalculationRequest['inputs'],
) {
  return engine(() => computePlan(definition, inputs));
}

export function createCalculationService(protocols: ProtocolService) {
  return {
    /**
     * A dose plan for any version, draft included: one that is not approved carries a warning
     * that it is for review only.
     */
    async plan(request: CalculationRequest) {
      const row = await protocols.resolveForUse(request.protocol.key, request.protocol.version);
      const plan: DosePlan = planFromEngine(row.definition, request.inputs);
      if (row.status !== 'approved') {
        plan.warnings.push({
          code: `protocol-${row.status}`,
          message: `Protocol ${row.key} version ${row.version} is ${row.status}: this plan is for review only and cannot be used for an order.`,
        });
      }
      return {
        plan,
        protocol: { key: row.key, version: row.version, status: row.status, sha256: row.sha256 },
      };
    },

    /** The light calculator: fills in the figures that were not given from those that were. */
    light: (request: LightCalculationRequest) => ({ solution: engine(() => solveLight(request)) }),
  };
}

export type CalculationService = ReturnType<typeof createCalculationService>;
