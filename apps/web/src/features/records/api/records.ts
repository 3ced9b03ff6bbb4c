import { useQuery } from '@tanstack/react-query';
import type { RecordsVerification } from '@emberline/contracts/records';
import { api } from '../../../lib/api-client';

export const recordsKeys = { verification: ['records', 'verification'] as const };

/** Walks both chains on the server: asked for, since it reads every record. */
export function useRecordsVerification() {
  return useQuery({
    queryKey: recordsKeys.verification,
    queryFn: () => api.get<RecordsVerification>('/records/verification'),
    staleTime: 0,
  });
}
