import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalibrationDecisionView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export interface CalibrationDecisionInput {
  chamberId: number;
  /** The suggestion exactly as shown. */
  key: string;
  decision: 'accepted' | 'rejected';
  comment: string;
}

export function decideCalibration({
  chamberId,
  ...body
}: CalibrationDecisionInput): Promise<CalibrationDecisionView> {
  return apiClient.post<CalibrationDecisionView>(`/chambers/${chamberId}/calibration/decisions`, body);
}

/** Accepts or rejects a suggestion; the chamber (its tooling factors) and its calibration reload. */
export function useDecideCalibration() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: decideCalibration,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['chambers'] }),
  });
}
