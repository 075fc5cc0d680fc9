import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcessSettingsView } from '@quietglass/shared';
import { apiClient } from '../../../lib/api-client';

export type { ProcessSetting, ProcessSettingsView } from '@quietglass/shared';

/** A chamber's process settings per material (version 0 and none before the first save). */
export function getProcessSettings(chamberId: number, signal?: AbortSignal): Promise<ProcessSettingsView> {
  return apiClient.get<ProcessSettingsView>(`/chambers/${chamberId}/process-settings`, signal);
}

export function getProcessSettingsQueryOptions(chamberId: number) {
  return queryOptions({
    queryKey: ['chambers', 'process-settings', chamberId] as const,
    queryFn: ({ signal }) => getProcessSettings(chamberId, signal),
  });
}

export function useProcessSettings(chamberId: number) {
  return useQuery(getProcessSettingsQueryOptions(chamberId));
}
