import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { getChambersQueryOptions, type ChamberMaterialSetting, type ChamberView } from './get-chambers';

/** What a chamber form sends (the API's ChamberDto). */
export interface ChamberInput {
  name: string;
  monitorWavelengthsNm: number[];
  monitorChipMaterialId: number;
  materials: ChamberMaterialSetting[];
  notes: string;
}

export function createChamber(input: ChamberInput): Promise<ChamberView> {
  return apiClient.post<ChamberView>('/chambers', input);
}

/** A new chamber; the form shows the API's refusals itself. */
export function useCreateChamber() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createChamber,
    meta: { errorShownInline: true },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getChambersQueryOptions().queryKey }),
  });
}
