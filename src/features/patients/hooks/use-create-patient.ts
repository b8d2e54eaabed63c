import { useMutation, useQueryClient } from '@tanstack/react-query';
import { createPatient } from '../api/create-patient';
import { patientQueries } from '../api/patient-queries';

export function useCreatePatient() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createPatient,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: patientQueries.searches() }),
  });
}
