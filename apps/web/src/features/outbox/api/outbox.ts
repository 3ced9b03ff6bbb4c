import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MailListResponse, MailMessage } from '@emberline/contracts/outbox';
import { api } from '../../../lib/api-client';

export const outboxKeys = {
  all: ['outbox'] as const,
  list: () => [...outboxKeys.all, 'list'] as const,
  detail: (id: string) => [...outboxKeys.all, 'detail', id] as const,
};

export const outboxQueryOptions = () =>
  queryOptions({
    queryKey: outboxKeys.list(),
    queryFn: () => api.get<MailListResponse>('/outbox'),
    staleTime: 0,
  });

export const mailQueryOptions = (id: string) =>
  queryOptions({
    queryKey: outboxKeys.detail(id),
    queryFn: () => api.get<MailMessage>(`/outbox/${encodeURIComponent(id)}`),
  });

export function useOutbox() {
  return useQuery(outboxQueryOptions());
}

export function useMail(id: string | null) {
  return useQuery({ ...mailQueryOptions(id ?? ''), enabled: id !== null });
}
