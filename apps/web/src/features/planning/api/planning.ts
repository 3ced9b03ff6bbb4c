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

export function usePlanning(query: Partial<PlanningQuery>) {
  const params = new URLSearchParams(
    Object.entries(query)
      .filter((entry) => entry[1] !== undefined && entry[1] !== '')
      .map(([key, value]) => [key, String(value)]),
  );
  return useQuery({
    queryKey: [...planningKeys.all, 'list', query],
    queryFn: () => api.get<PlanningResponse>(`/planning?${params.toString()}`),
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
  const params = new URLSearchParams(
    Object.entries(query)
      .filter((entry) => entry[1] !== undefined && entry[1] !== '' && entry[0] !== 'page')
      .map(([key, value]) => [key, String(value)]),
  );
  return apiUrl(`/planning/export?${params.toString()}`);
}
