import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { SeriesEntry } from '@emberline/contracts/findings';
import type { InspectionDetail } from '@emberline/contracts/inspections';
import type {
  Disposition,
  DispositionInput,
  InspectionReview,
  OutcomeInput,
  ReviewQueueItem,
  ReviewQueueQuery,
} from '@emberline/contracts/review';
import type { Page } from '@emberline/contracts/paging';
import { api } from '../../../lib/api-client';
import { findingQueryOptions } from '../../../lib/finding-query';
import { inspectionKeys } from '../../../lib/inspection-keys';

const path = (id: string) => encodeURIComponent(id);

export const REVIEW_QUEUE_PAGE_SIZE = 50;

export function useReviewQueue(query: ReviewQueueQuery, page: number) {
  const params = new URLSearchParams(
    Object.entries(query).filter((entry): entry is [string, string] => Boolean(entry[1])),
  );
  params.set('page', String(page));
  params.set('pageSize', String(REVIEW_QUEUE_PAGE_SIZE));
  return useQuery({
    queryKey: [...inspectionKeys.queue(query), page],
    queryFn: () => api.get<Page<ReviewQueueItem>>(`/review-queue?${params.toString()}`),
  });
}

export const reviewQueryOptions = (inspectionId: string) =>
  queryOptions({
    queryKey: inspectionKeys.review(inspectionId),
    queryFn: () => api.get<InspectionReview>(`/inspections/${path(inspectionId)}/dispositions`),
  });

export function useInspectionReview(inspectionId: string) {
  return useQuery(reviewQueryOptions(inspectionId));
}

/** One finding, wherever it is (an engine's page shows the trends of its open requirements). */
export function useFinding(findingId: string) {
  return useQuery(findingQueryOptions(findingId));
}

/** The earlier findings of the same damage series, oldest first. */
export function useDamageSeries(findingId: string | null) {
  return useQuery({
    queryKey: ['findings', 'series', findingId],
    queryFn: () =>
      api
        .get<{ items: SeriesEntry[] }>(`/findings/${path(findingId ?? '')}/series?pageSize=200`)
        .then((body) => body.items),
    enabled: findingId !== null,
  });
}

/** Every signature changes the inspection, its review, the queue and the fleet's view of it. */
function useSigned(inspectionId: string) {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: inspectionKeys.review(inspectionId) }),
      queryClient.invalidateQueries({ queryKey: inspectionKeys.detail(inspectionId) }),
      queryClient.invalidateQueries({ queryKey: [...inspectionKeys.all, 'queue'] }),
      queryClient.invalidateQueries({ queryKey: inspectionKeys.lists() }),
      queryClient.invalidateQueries({ queryKey: ['engines'] }),
      queryClient.invalidateQueries({ queryKey: ['planning'] }),
    ]);
}

export function useDispose(inspectionId: string) {
  const signed = useSigned(inspectionId);
  return useMutation({
    mutationFn: ({ findingId, input }: { findingId: string; input: DispositionInput }) =>
      api.post<Disposition>(`/findings/${path(findingId)}/dispositions`, input),
    onSuccess: signed,
  });
}

export function useSignOutcome(inspectionId: string) {
  const signed = useSigned(inspectionId);
  return useMutation({
    mutationFn: (input: OutcomeInput) =>
      api.post<InspectionReview>(`/inspections/${path(inspectionId)}/outcome`, input),
    onSuccess: signed,
  });
}

export function useRelease(inspectionId: string) {
  const signed = useSigned(inspectionId);
  return useMutation({
    mutationFn: (password: string) =>
      api.post<InspectionReview>(`/inspections/${path(inspectionId)}/release`, { password }),
    onSuccess: signed,
  });
}

export function useSendBack(inspectionId: string) {
  const signed = useSigned(inspectionId);
  return useMutation({
    mutationFn: (input: { reason: string; password?: string }) =>
      api.post<InspectionDetail>(`/inspections/${path(inspectionId)}/return`, input),
    onSuccess: signed,
  });
}
