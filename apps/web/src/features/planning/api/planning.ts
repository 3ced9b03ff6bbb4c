import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  BookingInput,
  EngineDue,
  PlanningQuery,
  PlanningResponse,
} from '@emberline/contracts/planning';
import { api, apiUrl } from '../../../lib/api-client';

export const planningKeys = {
  all: ['planning'] as const,
  due: (engineId: string) => [...planningKeys.all, 'due', engineId] as const,
};

/** When an engine is next due, computed by the server when read. */
export function useEngineDue(engineId: string, enabled = true) {
  return useQuery({
    queryKey: planningKeys.due(engineId),
    queryFn: () => api.get<EngineDue>(`/engines/${encodeURIComponent(engineId)}/due`),
    enabled,
  });
}

const searchOf = (query: Partial<PlanningQuery>) =>
  new URLSearchParams(
    Object.entries(query)
      .filter((entry) => entry[1] !== undefined && entry[1] !== '')
      .map(([key, value]) => [key, String(value)]),
  ).toString();

export function usePlanning(query: Partial<PlanningQuery>, enabled = true) {
  return useQuery({
    queryKey: [...planningKeys.all, 'list', query],
    queryFn: () => api.get<PlanningResponse>(`/planning?${searchOf(query)}`),
    enabled,
  });
}

/** Every engine due (inspection or removal) between two days, all pages: what a calendar shows. */
export function usePlanningBetween(query: Partial<PlanningQuery> & { from: string; to: string }) {
  return useQuery({
    queryKey: [...planningKeys.all, 'between', query],
    queryFn: async () => {
      const items: PlanningResponse['items'] = [];
      for (let page = 1; ; page += 1) {
        const body = await api.get<PlanningResponse>(
          `/planning?${searchOf({ ...query, page, pageSize: 200 })}`,
        );
        items.push(...body.items);
        if (items.length >= body.total || body.items.length === 0) return items;
      }
    },
  });
}

export function useBook(engineId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: BookingInput) =>
      api.put<EngineDue>(`/engines/${encodeURIComponent(engineId)}/booking`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: planningKeys.all }),
  });
}

/** Where the whole board, as filtered, downloads as CSV. */
export function planningCsvUrl(query: Partial<PlanningQuery>): string {
  return apiUrl(`/planning/export?${searchOf({ ...query, page: undefined })}`);
}
