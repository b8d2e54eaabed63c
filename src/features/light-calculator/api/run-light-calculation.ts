import { z } from 'zod';
import {
  lightSolutionSchema,
  type LightCalculationRequest,
  type LightSolution,
} from '../../../../shared/schemas/calculation';
import { api } from '../../../lib/api-client';

const solutionResponseSchema = z.object({ solution: lightSolutionSchema });

/** The server fills in whichever of the six figures were left out and shows its working. */
export async function runLightCalculation(
  request: LightCalculationRequest,
): Promise<LightSolution> {
  const { solution } = await api.post('/light-calculations', request, {
    schema: solutionResponseSchema,
  });
  return solution;
}
