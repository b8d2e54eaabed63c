import { useMutation } from '@tanstack/react-query';
import { lightCalculationKeys } from '../api/light-calculation-keys';
import { runLightCalculation } from '../api/run-light-calculation';

export function useLightCalculation() {
  return useMutation({ mutationKey: lightCalculationKeys.run(), mutationFn: runLightCalculation });
}
