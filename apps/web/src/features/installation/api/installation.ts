import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Installation, RecordsKeyState } from '@emberline/contracts/installation';
import { api } from '../../../lib/api-client';

export const installationKeys = { all: ['installation'] as const };

export const installationQueryOptions = () =>
  queryOptions({
    queryKey: installationKeys.all,
    queryFn: () => api.get<Installation>('/installation'),
    staleTime: Infinity,
  });

export function useInstallation() {
  return useQuery(installationQueryOptions());
}

/** Asked once signed in: whether the records key lies beside the records. */
export function useRecordsKeyState() {
  return useQuery({
    queryKey: [...installationKeys.all, 'records-key'],
    queryFn: () => api.get<RecordsKeyState>('/installation/records-key'),
    staleTime: Infinity,
  });
}
