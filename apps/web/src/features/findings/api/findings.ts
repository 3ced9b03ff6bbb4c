import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  CoverageInput,
  CoverageResponse,
  Finding,
  FindingInput,
  FindingListResponse,
  SeriesEntry,
} from '@emberline/contracts/findings';
import type {
  Image,
  ImageCalibrationInput,
  InspectionDetail,
} from '@emberline/contracts/inspections';
import type { LimitSet, LimitSetSummary } from '@emberline/contracts/limit-sets';
import { api } from '../../../lib/api-client';
import { inspectionKeys } from '../../../lib/inspection-keys';

const path = (id: string) => `/inspections/${encodeURIComponent(id)}`;

export const findingKeys = {
  list: (inspectionId: string) => [...inspectionKeys.detail(inspectionId), 'findings'] as const,
  coverage: (inspectionId: string) => [...inspectionKeys.detail(inspectionId), 'coverage'] as const,
  candidates: (inspectionId: string, match: object) =>
    [...inspectionKeys.detail(inspectionId), 'series-candidates', match] as const,
  limitSetInForce: (modelId: string) => ['limit-sets', 'in-force', modelId] as const,
};

export const findingsQueryOptions = (inspectionId: string) =>
  queryOptions({
    queryKey: findingKeys.list(inspectionId),
    queryFn: () => api.get<FindingListResponse>(`${path(inspectionId)}/findings`),
  });

export function useFindings(inspectionId: string) {
  return useQuery(findingsQueryOptions(inspectionId));
}

export function useCoverage(inspectionId: string) {
  return useQuery({
    queryKey: findingKeys.coverage(inspectionId),
    queryFn: () => api.get<CoverageResponse>(`${path(inspectionId)}/coverage`),
  });
}

/** The revision in force for a model, with its rules: what live verdicts are judged against. */
export function useLimitSetInForce(modelId: string | null, enabled: boolean) {
  return useQuery({
    queryKey: findingKeys.limitSetInForce(modelId ?? ''),
    enabled: enabled && modelId !== null,
    staleTime: 60_000,
    queryFn: async () => {
      const { items } = await api.get<{ items: LimitSetSummary[] }>(
        `/engine-models/${encodeURIComponent(modelId!)}/limit-sets?pageSize=200`,
      );
      const inForce = items.find((item) => item.status === 'published');
      return inForce ? api.get<LimitSet>(`/limit-sets/${encodeURIComponent(inForce.id)}`) : null;
    },
  });
}

export function useSeriesCandidates(
  inspectionId: string,
  match: { row: string; position: number; damage: string } | null,
) {
  return useQuery({
    queryKey: findingKeys.candidates(inspectionId, match ?? {}),
    enabled: match !== null,
    queryFn: () =>
      api
        .get<{ items: SeriesEntry[] }>(
          `${path(inspectionId)}/series-candidates?${new URLSearchParams({
            row: match!.row,
            position: String(match!.position),
            damage: match!.damage,
            pageSize: '200',
          })}`,
        )
        .then((body) => body.items),
  });
}

function useInvalidateFindings(inspectionId: string) {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: findingKeys.list(inspectionId) }),
      queryClient.invalidateQueries({ queryKey: findingKeys.coverage(inspectionId) }),
    ]);
}

export function useRecordFinding(inspectionId: string) {
  const invalidate = useInvalidateFindings(inspectionId);
  return useMutation({
    mutationFn: (input: FindingInput) => api.post<Finding>(`${path(inspectionId)}/findings`, input),
    onSuccess: () => invalidate(),
  });
}

/** A recorded finding corrected: the whole inspection is judged again on the server. */
export function useUpdateFinding(inspectionId: string) {
  const invalidate = useInvalidateFindings(inspectionId);
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: FindingInput }) =>
      api.put<Finding>(`/findings/${encodeURIComponent(id)}`, input),
    onSuccess: () => invalidate(),
  });
}

export function useVoidFinding(inspectionId: string) {
  const invalidate = useInvalidateFindings(inspectionId);
  return useMutation({
    mutationFn: ({ id, reason }: { id: string; reason: string }) =>
      api.post<Finding>(`/findings/${encodeURIComponent(id)}/void`, { reason }),
    onSuccess: () => invalidate(),
  });
}

export function useRecordCoverage(inspectionId: string) {
  const queryClient = useQueryClient();
  const invalidate = useInvalidateFindings(inspectionId);
  return useMutation({
    mutationFn: ({ row, input }: { row: string; input: CoverageInput }) =>
      api.put<CoverageResponse>(`${path(inspectionId)}/coverage/${encodeURIComponent(row)}`, input),
    onSuccess: (response) => {
      queryClient.setQueryData(findingKeys.coverage(inspectionId), response);
      void invalidate();
    },
  });
}

/** Saves the scale of a still at once, and puts the saved still into the inspection on screen. */
export function useCalibrateImage(inspectionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ imageId, input }: { imageId: string; input: ImageCalibrationInput }) =>
      api.put<Image>(`/images/${encodeURIComponent(imageId)}/calibration`, input),
    onSuccess: (saved) =>
      queryClient.setQueryData<InspectionDetail>(inspectionKeys.detail(inspectionId), (detail) =>
        detail
          ? {
              ...detail,
              images: detail.images.map((image) => (image.id === saved.id ? saved : image)),
            }
          : detail,
      ),
  });
}
