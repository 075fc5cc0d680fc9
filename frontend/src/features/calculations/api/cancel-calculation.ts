import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getCalculationQueryOptions, type CalculationView } from './get-calculation';
import { getCalculationsQueryOptions } from './get-calculations';

export function cancelCalculation(id: number): Promise<CalculationView> {
  return apiClient.post<CalculationView>(`/calculations/${id}/cancel`);
}

/** Stops a queued or running calculation; a 409 (already finished) goes to the snackbar. */
export function useCancelCalculation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: cancelCalculation,
    onSuccess: (cancelled) => {
      queryClient.setQueryData(getCalculationQueryOptions(cancelled.id).queryKey, cancelled);
      return queryClient.invalidateQueries({ queryKey: getCalculationsQueryOptions().queryKey });
    },
    onError: (_error, id) =>
      queryClient.invalidateQueries({ queryKey: getCalculationQueryOptions(id).queryKey }),
  });
}
