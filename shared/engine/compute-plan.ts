import type { ProtocolVersion } from '../protocol/protocol-schema';
import { planInputsSchema, type DosePlan, type PlanInputs } from '../schemas/calculation';
import { computeCxlPlan } from './cxl-plan';
import { computePdtPlan } from './pdt-plan';
import { planInputErrorFromZod } from './plan-input-error';

/**
 * The dose plan for one protocol version and one patient's inputs. Pure: the same protocol
 * and inputs always give the same plan. Throws PlanInputError naming every unusable field.
 * The protocol is trusted to have passed protocolVersionSchema (the server loads it so).
 */
export function computePlan(protocol: ProtocolVersion, inputs: PlanInputs): DosePlan {
  // Inputs are parsed again here because the client may call the engine with raw form data.
  const parsed = planInputsSchema.safeParse(inputs);
  if (!parsed.success) throw planInputErrorFromZod(parsed.error, 'inputs');
  return protocol.kind === 'pdt'
    ? computePdtPlan(protocol, parsed.data)
    : computeCxlPlan(protocol, parsed.data);
}
