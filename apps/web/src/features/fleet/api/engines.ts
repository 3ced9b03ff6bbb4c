import {
  keepPreviousData,
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
} from '@tanstack/react-query';
import type {
  EngineDetail,
  EngineInput,
  EngineListQuery,
  EngineListResponse,
  EngineUpdate,
  UtilizationImportPreview,
  UtilizationListResponse,
  UtilizationRecordInput,
} from '@emberline/contracts/fleet';
import { api } from '../../../lib/api-client';

export const engineKeys = {
  all: ['engines'] as const,
  lists: () => [...engineKeys.all, 'list'] as const,
  list: (query: Partial<EngineListQuery>) => [...engineKeys.lists(), query] as const,
  detail: (id: string) => [...engineKeys.all, 'detail', id] as const,
  utilization: (id: string) => [...engineKeys.all, 'detail', id, 'utilization'] as const,
};

function searchOf(query: Partial<EngineListQuery>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query))
    if (value !== undefined && value !== '') params.set(key, String(value));
  return params.toString();
}

export const enginesQueryOptions = (query: Partial<EngineListQuery>) =>
  queryOptions({
    queryKey: engineKeys.list(query),
    queryFn: () => api.get<EngineListResponse>(`/engines?${searchOf(query)}`),
    placeholderData: keepPreviousData,
  });

export const engineQueryOptions = (id: string) =>
  queryOptions({
    queryKey: engineKeys.detail(id),
    queryFn: () => api.get<EngineDetail>(`/engines/${encodeURIComponent(id)}`),
  });

export const utilizationQueryOptions = (id: string, page = 1) =>
  queryOptions({
    queryKey: [...engineKeys.utilization(id), page],
    queryFn: () =>
      api.get<UtilizationListResponse>(
        `/engines/${encodeURIComponent(id)}/utilization?page=${page}&pageSize=${UTILIZATION_PAGE_SIZE}`,
      ),
  });

export const UTILIZATION_PAGE_SIZE = 50;

export function useEngines(query: Partial<EngineListQuery>) {
  return useQuery(enginesQueryOptions(query));
}

export function useEngine(id: string) {
  return useQuery(engineQueryOptions(id));
}

export function useUtilization(id: string, page?: number) {
  return useQuery(utilizationQueryOptions(id, page));
}

export function useCreateEngine() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: EngineInput) => api.post<EngineDetail>('/engines', input),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: engineKeys.all }),
        // What an engine's due date rests on changed: the planning board reads it again.
        queryClient.invalidateQueries({ queryKey: ['planning'] }),
      ]),
  });
}

export function useUpdateEngine(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (changes: EngineUpdate) =>
      api.patch<EngineDetail>(`/engines/${encodeURIComponent(id)}`, changes),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: engineKeys.all }),
        // What an engine's due date rests on changed: the planning board reads it again.
        queryClient.invalidateQueries({ queryKey: ['planning'] }),
      ]),
  });
}

export function useAddUtilization(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (record: UtilizationRecordInput) =>
      api.post<UtilizationListResponse>(`/engines/${encodeURIComponent(id)}/utilization`, record),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: engineKeys.detail(id) }),
        // What an engine's due date rests on changed: the planning board reads it again.
        queryClient.invalidateQueries({ queryKey: ['planning'] }),
      ]),
  });
}

export function usePreviewUtilizationImport(id: string) {
  return useMutation({
    mutationFn: (file: File) =>
      api.upload<UtilizationImportPreview>(
        `/engines/${encodeURIComponent(id)}/utilization/import-preview`,
        file,
        'text/csv',
      ),
  });
}

export function useImportUtilization(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) =>
      api.upload<UtilizationImportPreview & { saved: number }>(
        `/engines/${encodeURIComponent(id)}/utilization/import`,
        file,
        'text/csv',
      ),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: engineKeys.detail(id) }),
        // What an engine's due date rests on changed: the planning board reads it again.
        queryClient.invalidateQueries({ queryKey: ['planning'] }),
      ]),
  });
}
