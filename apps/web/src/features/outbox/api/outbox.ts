import {
  keepPreviousData,
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
} from '@tanstack/react-query';
import type {
  MailListResponse,
  MailMessage,
  OutboxListQuery,
  OutboxListResponse,
  OutboxMessageDetail,
  OutboxSummary,
} from '@emberline/contracts/outbox';
import { api } from '../../../lib/api-client';

export const outboxKeys = {
  all: ['outbox'] as const,
  messages: (filter: OutboxListQuery) => [...outboxKeys.all, 'messages', filter] as const,
  message: (id: string) => [...outboxKeys.all, 'message', id] as const,
  summary: () => [...outboxKeys.all, 'summary'] as const,
  caught: () => [...outboxKeys.all, 'caught'] as const,
  caughtMessage: (id: string) => [...outboxKeys.all, 'caught', id] as const,
};

function query(filter: OutboxListQuery): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filter))
    if (value !== undefined && value !== '') params.set(key, String(value));
  const text = params.toString();
  return text ? `?${text}` : '';
}

export const outboxMessagesQueryOptions = (filter: OutboxListQuery) =>
  queryOptions({
    queryKey: outboxKeys.messages(filter),
    queryFn: () => api.get<OutboxListResponse>(`/outbox/messages${query(filter)}`),
    placeholderData: keepPreviousData,
    // Delivery goes on in the background: the list follows it.
    refetchInterval: 5_000,
  });

export function useOutboxMessages(filter: OutboxListQuery) {
  return useQuery(outboxMessagesQueryOptions(filter));
}

export function useOutboxMessage(id: string | null) {
  return useQuery({
    queryKey: outboxKeys.message(id ?? ''),
    queryFn: () => api.get<OutboxMessageDetail>(`/outbox/messages/${encodeURIComponent(id!)}`),
    enabled: id !== null,
    refetchInterval: 5_000,
  });
}

/** How many messages are in each state; the admins' banner asks every half minute. */
export function useOutboxSummary(enabled: boolean) {
  return useQuery({
    queryKey: outboxKeys.summary(),
    queryFn: () => api.get<OutboxSummary>('/outbox/summary'),
    enabled,
    refetchInterval: 30_000,
  });
}

export function useResendMessage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) =>
      api.post<OutboxMessageDetail>(`/outbox/messages/${encodeURIComponent(id)}/resend`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: outboxKeys.all }),
  });
}

export const CAUGHT_PAGE_SIZE = 50;

export function useCaughtMail(page = 1) {
  return useQuery({
    queryKey: [...outboxKeys.caught(), page],
    queryFn: () =>
      api.get<MailListResponse>(`/outbox/caught?page=${page}&pageSize=${CAUGHT_PAGE_SIZE}`),
    staleTime: 0,
    refetchInterval: 5_000,
  });
}

export function useCaughtMessage(id: string | null) {
  return useQuery({
    queryKey: outboxKeys.caughtMessage(id ?? ''),
    queryFn: () => api.get<MailMessage>(`/outbox/caught/${encodeURIComponent(id!)}`),
    enabled: id !== null,
  });
}
