import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  CredentialsInput,
  InviteUserInput,
  InviteUserResponse,
  UpdateUserInput,
  User,
  UserListResponse,
} from '@emberline/contracts/users';
import { api } from '../../../lib/api-client';

export const userKeys = {
  all: ['users'] as const,
  list: (page: number, pageSize: number) => [...userKeys.all, 'list', page, pageSize] as const,
};

/** A page of users; by default the first 200, the most a page holds, for choosing a person. */
export const usersQueryOptions = (page = 1, pageSize = 200) =>
  // Sessions and statuses change by other people's hands: fetch afresh whenever the page opens.
  queryOptions({
    queryKey: userKeys.list(page, pageSize),
    queryFn: () => api.get<UserListResponse>(`/users?page=${page}&pageSize=${pageSize}`),
    staleTime: 0,
  });

export function useUsers(page?: number, pageSize?: number) {
  return useQuery(usersQueryOptions(page, pageSize));
}

export function useInviteUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteUserInput) => api.post<InviteUserResponse>('/users', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.all }),
  });
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes }: { id: string; changes: UpdateUserInput }) =>
      api.patch<{ user: User }>(`/users/${encodeURIComponent(id)}`, changes),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.all }),
  });
}

export function useResendInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) =>
      api.post<InviteUserResponse>(`/users/${encodeURIComponent(id)}/invitation`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.all }),
  });
}

export function useEndSessions() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) =>
      api.delete<{ ended: number }>(`/users/${encodeURIComponent(id)}/sessions`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.all }),
  });
}

export function useSetCredentials() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, credentials }: { id: string; credentials: CredentialsInput }) =>
      api.put<{ user: User }>(`/users/${encodeURIComponent(id)}/credentials`, credentials),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.all }),
  });
}
