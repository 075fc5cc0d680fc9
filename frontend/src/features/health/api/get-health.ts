import { queryOptions, useQuery } from '@tanstack/react-query';
import { ApiError, apiClient } from '../../../lib/api-client';

export interface HealthReport {
  status: 'ok' | 'degraded';
  database: { ok: boolean };
  redis: { ok: boolean };
  queue: { ok: boolean };
  worker: { ok: boolean };
}

function isHealthReport(value: unknown): value is HealthReport {
  if (typeof value !== 'object' || value === null) return false;
  const v = value as Record<string, unknown>;
  const part = (key: string) => typeof v[key] === 'object' && v[key] !== null && 'ok' in v[key];
  return (
    (v.status === 'ok' || v.status === 'degraded') && ['database', 'redis', 'queue', 'worker'].every(part)
  );
}

/** Service status; a degraded service may answer with a 5xx status and the same report. */
export async function getHealth(signal?: AbortSignal): Promise<HealthReport> {
  try {
    const report = await apiClient.get<unknown>('/health', signal);
    if (!isHealthReport(report)) throw new ApiError(0, 'The status answer has an unexpected shape.');
    return report;
  } catch (error) {
    if (error instanceof ApiError && error.status >= 500 && isHealthReport(error.body)) return error.body;
    throw error;
  }
}

export function getHealthQueryOptions() {
  return queryOptions({
    queryKey: ['health'] as const,
    queryFn: ({ signal }) => getHealth(signal),
    refetchInterval: 60_000,
    retry: false,
  });
}

export function useHealth() {
  return useQuery(getHealthQueryOptions());
}
