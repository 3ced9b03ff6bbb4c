import { keepPreviousData, useQuery } from '@tanstack/react-query';
import type {
  DeliveryLog,
  ReportListQuery,
  ReportListResponse,
  UndeliveredUrgentNotice,
} from '@emberline/contracts/reports';
import { api, apiUrl } from '../../../lib/api-client';

const reportKeys = {
  list: (query: ReportListQuery) => ['reports', 'list', query] as const,
  deliveries: (inspectionId: string) => ['reports', 'deliveries', inspectionId] as const,
  undeliveredUrgent: () => ['reports', 'undelivered-urgent'] as const,
};

const search = (query: ReportListQuery) =>
  new URLSearchParams(
    Object.entries(query).flatMap(([key, value]) =>
      value === undefined || value === '' ? [] : [[key, String(value)]],
    ),
  ).toString();

/** Issued reports, newest release first: the caller's own organisation's, or every one for staff. */
export function useReports(query: ReportListQuery) {
  return useQuery({
    queryKey: reportKeys.list(query),
    queryFn: () => api.get<ReportListResponse>(`/reports?${search(query)}`),
    placeholderData: keepPreviousData,
  });
}

/** Where an inspection's report mails and urgent notices stand; refreshed while any waits. */
export function useDeliveries(inspectionId: string) {
  return useQuery({
    queryKey: reportKeys.deliveries(inspectionId),
    queryFn: () =>
      api.get<DeliveryLog>(
        `/inspections/${encodeURIComponent(inspectionId)}/deliveries?pageSize=200`,
      ),
    refetchInterval: (query) =>
      query.state.data?.items.some((item) => item.state !== 'sent') ? 15_000 : false,
  });
}

/** Urgent notices that have not reached their owner (engineers and administrators). */
export function useUndeliveredUrgent(enabled: boolean) {
  return useQuery({
    queryKey: reportKeys.undeliveredUrgent(),
    queryFn: () =>
      api.get<{ items: UndeliveredUrgentNotice[]; total: number }>(
        '/urgent-notices/undelivered?pageSize=200',
      ),
    enabled,
    refetchInterval: 30_000,
  });
}

/** The address a report revision downloads from. */
export const reportUrl = (inspectionId: string, revision: number) =>
  apiUrl(`/inspections/${encodeURIComponent(inspectionId)}/report?revision=${revision}`);
