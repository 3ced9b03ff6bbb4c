import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  Contact,
  ContactInput,
  OrganisationDetail,
  OrganisationInput,
  OrganisationListResponse,
} from '@emberline/contracts/organisations';
import { api } from '../../../lib/api-client';

export const organisationKeys = {
  all: ['organisations'] as const,
  list: () => [...organisationKeys.all, 'list'] as const,
  detail: (id: string) => [...organisationKeys.all, 'detail', id] as const,
};

/**
 * The organisations to choose from: the first 200, the most a page holds (DESIGN §6); the
 * organisations screen says when there are more.
 */
const organisationsPageOptions = () =>
  queryOptions({
    queryKey: organisationKeys.list(),
    queryFn: () => api.get<OrganisationListResponse>('/organisations?pageSize=200'),
    staleTime: 5 * 60_000,
  });

export const organisationsQueryOptions = () =>
  queryOptions({ ...organisationsPageOptions(), select: (page) => page.items });

/** The page of organisations with its total, for the screen that lists them. */
export function useOrganisationsPage() {
  return useQuery(organisationsPageOptions());
}

export const organisationQueryOptions = (id: string) =>
  queryOptions({
    queryKey: organisationKeys.detail(id),
    queryFn: () => api.get<OrganisationDetail>(`/organisations/${encodeURIComponent(id)}`),
  });

export function useOrganisations(enabled = true) {
  return useQuery({ ...organisationsQueryOptions(), enabled });
}

export function useOrganisation(id: string | null) {
  return useQuery({ ...organisationQueryOptions(id ?? ''), enabled: id !== null });
}

export function useCreateOrganisation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: OrganisationInput) => api.post<OrganisationDetail>('/organisations', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: organisationKeys.all }),
  });
}

export function useAddContact(organisationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ContactInput) =>
      api.post<Contact>(`/organisations/${encodeURIComponent(organisationId)}/contacts`, input),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: organisationKeys.detail(organisationId) }),
  });
}

export function useRemoveContact(organisationId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (contactId: string) =>
      api.delete<void>(
        `/organisations/${encodeURIComponent(organisationId)}/contacts/${encodeURIComponent(contactId)}`,
      ),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: organisationKeys.detail(organisationId) }),
  });
}
