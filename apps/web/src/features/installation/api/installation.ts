import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Installation } from '@emberline/contracts/installation';
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
