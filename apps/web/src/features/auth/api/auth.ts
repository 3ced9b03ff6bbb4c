import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  AcceptInvitationInput,
  ChangePasswordInput,
  InvitationInfo,
  LoginInput,
  MeResponse,
  PasswordResetConfirm,
  SessionUser,
} from '@emberline/contracts/auth';
import { api, ApiError } from '../../../lib/api-client';

export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

/** The signed-in user, or null when nobody is signed in. */
export async function getCurrentUser(): Promise<SessionUser | null> {
  try {
    return (await api.get<MeResponse>('/auth/me')).user;
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const currentUserQueryOptions = () =>
  queryOptions({ queryKey: authKeys.me(), queryFn: getCurrentUser, staleTime: 60_000 });

export function useCurrentUser() {
  return useQuery(currentUserQueryOptions());
}

export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LoginInput) => api.post<MeResponse>('/auth/login', input),
    onSuccess: ({ user }) => {
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}

export function useLogout() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async () => {
      // The signed-in screens go first, so that nothing starts a new read; the reads already on
      // their way finish while the session lasts. Ended mid-way by the sign-out, they would be
      // refused (401) and shown as errors for a moment.
      queryClient.setQueryData(authKeys.me(), null);
      for (let waited = 0; waited < 2_000; waited += 25) {
        await new Promise((resolve) => setTimeout(resolve, 25));
        if (queryClient.isFetching() === 0) break;
      }
      await api.post<void>('/auth/logout');
    },
    onSettled: () => {
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), null);
    },
  });
}

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ChangePasswordInput) => api.post<MeResponse>('/auth/password', input),
    onSuccess: ({ user }) => queryClient.setQueryData(authKeys.me(), user),
  });
}

export function useRequestPasswordReset() {
  return useMutation({
    mutationFn: (email: string) => api.post<{ status: string }>('/auth/password-reset', { email }),
  });
}

export function useConfirmPasswordReset() {
  return useMutation({
    mutationFn: (input: PasswordResetConfirm) =>
      api.post<void>('/auth/password-reset/confirm', input),
  });
}

export function invitationQueryOptions(token: string) {
  return queryOptions({
    queryKey: [...authKeys.all, 'invitation', token] as const,
    queryFn: () => api.post<InvitationInfo>('/auth/invitations/inspect', { token }),
    retry: false,
  });
}

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AcceptInvitationInput) =>
      api.post<MeResponse>('/auth/invitations/accept', input),
    onSuccess: ({ user }) => {
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
