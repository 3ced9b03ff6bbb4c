import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  LimitFileFormat,
  LimitImportPreview,
  LimitSet,
  LimitSetCopyInput,
  LimitSetImpact,
  LimitSetSummary,
} from '@emberline/contracts/limit-sets';
import type { Rule } from '@emberline/contracts/limits';
import { api } from '../../../lib/api-client';
import { inspectionKeys } from '../../../lib/inspection-keys';

const path = (id: string) => `/limit-sets/${encodeURIComponent(id)}`;

export const limitSetKeys = {
  all: ['limit-sets'] as const,
  ofModel: (modelId: string) => [...limitSetKeys.all, 'model', modelId] as const,
  detail: (id: string) => [...limitSetKeys.all, 'detail', id] as const,
  impact: (id: string) => [...limitSetKeys.all, 'impact', id] as const,
};

/** The revisions of a model; nothing is asked until the model is known. */
export function useLimitSets(modelId: string) {
  return useQuery({
    queryKey: limitSetKeys.ofModel(modelId),
    enabled: modelId !== '',
    queryFn: () =>
      api
        .get<{ items: LimitSetSummary[] }>(
          `/engine-models/${encodeURIComponent(modelId)}/limit-sets?pageSize=200`,
        )
        .then((body) => body.items),
  });
}

export function useLimitSet(id: string) {
  return useQuery({
    queryKey: limitSetKeys.detail(id),
    queryFn: () => api.get<LimitSet>(path(id)),
  });
}

/** Asked for, not fetched on sight: it judges every current finding of the model. */
export function useImpact(id: string, enabled: boolean) {
  return useQuery({
    queryKey: limitSetKeys.impact(id),
    enabled,
    staleTime: 0,
    queryFn: () => api.get<LimitSetImpact>(`${path(id)}/impact`),
  });
}

export const exportUrl = (id: string, format: LimitFileFormat) =>
  `/api/v1${path(id)}/export?format=${format}`;

function useInvalidateLibrary() {
  const queryClient = useQueryClient();
  return () => queryClient.invalidateQueries({ queryKey: limitSetKeys.all });
}

export function useCopyLimitSet(sourceId: string) {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: (input: LimitSetCopyInput) => api.post<LimitSet>(`${path(sourceId)}/copies`, input),
    onSuccess: () => invalidate(),
  });
}

export function useUpdateParticulars(id: string) {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: (input: LimitSetCopyInput) => api.patch<LimitSet>(path(id), input),
    onSuccess: () => invalidate(),
  });
}

export function useReplaceRules(id: string) {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: (rules: Rule[]) => api.put<LimitSet>(`${path(id)}/rules`, { rules }),
    onSuccess: () => invalidate(),
  });
}

const formatOf = (file: File): LimitFileFormat =>
  file.name.toLowerCase().endsWith('.json') ? 'json' : 'csv';

export function usePreviewImport(id: string) {
  return useMutation({
    mutationFn: (file: File) =>
      api.upload<LimitImportPreview>(
        `${path(id)}/import-preview?format=${formatOf(file)}`,
        file,
        'application/octet-stream',
      ),
  });
}

export function useImportRules(id: string) {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: (file: File) =>
      api.upload<LimitSet>(
        `${path(id)}/import?format=${formatOf(file)}`,
        file,
        'application/octet-stream',
      ),
    onSuccess: () => invalidate(),
  });
}

/** Publishing judges the open inspections again: their findings are fetched afresh. */
/** The independent check of a draft, signed with the checker's password. */
export function useCheckLimitSet(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (password: string) => api.post<LimitSet>(`${path(id)}/check`, { password }),
    onSuccess: (checked) => {
      queryClient.setQueryData(limitSetKeys.detail(id), checked);
    },
  });
}

export function usePublish(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (password: string) => api.post<LimitSet>(`${path(id)}/publication`, { password }),
    onSuccess: (published) => {
      // A published revision has no impact preview: stop asking before the library refreshes.
      queryClient.setQueryData(limitSetKeys.detail(id), published);
      queryClient.removeQueries({ queryKey: limitSetKeys.impact(id) });
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: limitSetKeys.all }),
        queryClient.invalidateQueries({ queryKey: inspectionKeys.all }),
      ]);
    },
  });
}
