import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import {
  getProcessSettingsQueryOptions,
  type ProcessSetting,
  type ProcessSettingsView,
} from './get-process-settings';

export interface SaveProcessSettingsInput {
  chamberId: number;
  /** The version the edit started from; someone else's save in between gives 409. */
  version: number;
  settings: ProcessSetting[];
}

export function saveProcessSettings({
  chamberId,
  version,
  settings,
}: SaveProcessSettingsInput): Promise<ProcessSettingsView> {
  return apiClient.put<ProcessSettingsView>(`/chambers/${chamberId}/process-settings`, { settings, version });
}

/** Replaces a chamber's whole set of process settings; the dialog shows 400 and 409 itself. */
export function useSaveProcessSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveProcessSettings,
    meta: { errorShownInline: true },
    onSuccess: (saved) =>
      queryClient.setQueryData(getProcessSettingsQueryOptions(saved.chamberId).queryKey, saved),
  });
}
