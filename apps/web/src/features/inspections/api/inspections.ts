import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  Image,
  ImageTagInput,
  Inspection,
  InspectionDefaults,
  InspectionDetail,
  InspectionInput,
  InspectionParticularsInput,
} from '@emberline/contracts/inspections';
import { api, apiUrl } from '../../../lib/api-client';
import { inspectionKeys } from '../../../lib/inspection-keys';

/** An engine's inspections, newest first: four a year fill a page of 200 in fifty years. */
export const inspectionsQueryOptions = (engineId: string) =>
  queryOptions({
    queryKey: inspectionKeys.list(engineId),
    queryFn: () =>
      api
        .get<{
          items: Inspection[];
        }>(`/inspections?engineId=${encodeURIComponent(engineId)}&pageSize=200`)
        .then((body) => body.items),
  });

export const inspectionQueryOptions = (id: string) =>
  queryOptions({
    queryKey: inspectionKeys.detail(id),
    queryFn: () => api.get<InspectionDetail>(`/inspections/${encodeURIComponent(id)}`),
  });

export function useInspections(engineId: string) {
  return useQuery(inspectionsQueryOptions(engineId));
}

export function useInspection(id: string) {
  return useQuery(inspectionQueryOptions(id));
}

export function useCreateInspection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InspectionInput) => api.post<InspectionDetail>('/inspections', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: inspectionKeys.all }),
  });
}

export function useAcknowledgeFlag(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ code, note }: { code: string; note: string }) =>
      api.post<InspectionDetail>(
        `/inspections/${encodeURIComponent(id)}/flags/${code}/acknowledgement`,
        { note },
      ),
    onSuccess: (detail) => queryClient.setQueryData(inspectionKeys.detail(id), detail),
  });
}

export function useTagImage(inspectionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ imageId, tag }: { imageId: string; tag: ImageTagInput }) =>
      api.patch<Image>(`/images/${encodeURIComponent(imageId)}`, tag),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: inspectionKeys.detail(inspectionId) }),
  });
}

/** Where the upload queue sends the stills of an inspection, one file a request. */
export const imageUploadUrl = (inspectionId: string) =>
  apiUrl(`/inspections/${encodeURIComponent(inspectionId)}/images`);

export function useSubmitInspection(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () =>
      api.post<InspectionDetail>(`/inspections/${encodeURIComponent(id)}/submission`),
    onSuccess: (detail) => {
      queryClient.setQueryData(inspectionKeys.detail(id), detail);
      void queryClient.invalidateQueries({ queryKey: inspectionKeys.lists() });
    },
  });
}

/** The signed-in inspector's qualification and last probe, for a new inspection. */
export function useInspectionDefaults() {
  return useQuery({
    queryKey: [...inspectionKeys.all, 'defaults'] as const,
    queryFn: () => api.get<InspectionDefaults>('/inspections/defaults'),
    staleTime: 0,
  });
}

function useDetailMutation<T>(id: string, send: (body: T) => Promise<InspectionDetail>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: (detail) => {
      queryClient.setQueryData(inspectionKeys.detail(id), detail);
      void queryClient.invalidateQueries({ queryKey: inspectionKeys.all });
    },
  });
}

/** Corrects a draft's particulars; the answer carries the flags computed again. */
export function useCorrectInspection(id: string) {
  return useDetailMutation(id, (input: InspectionParticularsInput) =>
    api.patch<InspectionDetail>(`/inspections/${encodeURIComponent(id)}`, input),
  );
}

/** Voids a draft started by mistake, with the reason. */
export function useVoidInspection(id: string) {
  return useDetailMutation(id, (reason: string) =>
    api.post<InspectionDetail>(`/inspections/${encodeURIComponent(id)}/void`, { reason }),
  );
}
