import { keepPreviousData, useQuery } from '@tanstack/react-query';
import type {
  FindingSearchQuery,
  FindingSearchResponse,
} from '@emberline/contracts/fleet-findings';
import { api } from '../../../lib/api-client';

/** The query as the API and the address bar take it: only what is set. */
export const searchParamsOf = (query: FindingSearchQuery) =>
  new URLSearchParams(
    Object.entries(query).flatMap(([key, value]) =>
      value === undefined || value === '' ? [] : [[key, String(value)]],
    ),
  );

/** One page of the fleet findings search, kept on screen while the next loads. */
export function useFindingSearch(query: FindingSearchQuery) {
  return useQuery({
    queryKey: ['fleet-findings', query],
    queryFn: () => api.get<FindingSearchResponse>(`/findings?${searchParamsOf(query).toString()}`),
    placeholderData: keepPreviousData,
  });
}
