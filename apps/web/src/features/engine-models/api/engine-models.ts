import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { EngineModel, EngineModelInput, EngineModelSummary } from '@emberline/contracts/fleet';
import type { Page } from '@emberline/contracts/paging';
import { api } from '../../../lib/api-client';

export const engineModelKeys = {
  all: ['engine-models'] as const,
  list: () => [...engineModelKeys.all, 'list'] as const,
  detail: (id: string) => [...engineModelKeys.all, 'detail', id] as const,
};

/** The engine models to choose from: the first 200, the most a page holds (DESIGN §6). */
export const engineModelsQueryOptions = () =>
  queryOptions({
    queryKey: engineModelKeys.list(),
    queryFn: () => api.get<Page<EngineModelSummary>>('/engine-models?pageSize=200'),
    select: (page) => page.items,
  });

export const engineModelQueryOptions = (id: string) =>
  queryOptions({
    queryKey: engineModelKeys.detail(id),
    queryFn: () => api.get<EngineModel>(`/engine-models/${encodeURIComponent(id)}`),
  });

export function useEngineModels() {
  return useQuery(engineModelsQueryOptions());
}

export function useEngineModel(id: string | null) {
  return useQuery({ ...engineModelQueryOptions(id ?? ''), enabled: id !== null });
}

export function useSaveEngineModel(id: string | null) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: EngineModelInput) =>
      id
        ? api.put<EngineModel>(`/engine-models/${encodeURIComponent(id)}`, input)
        : api.post<EngineModel>('/engine-models', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: engineModelKeys.all }),
  });
}

export function useNewEngineModelVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) =>
      api.post<EngineModel>(`/engine-models/${encodeURIComponent(id)}/versions`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: engineModelKeys.all }),
  });
}
