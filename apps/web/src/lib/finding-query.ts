import { queryOptions } from '@tanstack/react-query';
import type { Finding } from '@emberline/contracts/findings';
import { api } from './api-client';

/** One finding by its id, wherever it is: an earlier finding of a series, an open requirement. */
export const findingQueryOptions = (findingId: string) =>
  queryOptions({
    queryKey: ['findings', 'detail', findingId],
    queryFn: () => api.get<Finding>(`/findings/${encodeURIComponent(findingId)}`),
    staleTime: 60_000,
  });
