import { useQuery } from '@tanstack/react-query';
import type { EngineDue } from '@emberline/contracts/planning';
import { api } from '../../../lib/api-client';

export const planningKeys = {
  all: ['planning'] as const,
  due: (engineId: string) => [...planningKeys.all, 'due', engineId] as const,
};

/** When an engine is next due, computed by the server when read. */
export function useEngineDue(engineId: string, enabled = true) {
  return useQuery({
    queryKey: planningKeys.due(engineId),
    queryFn: () => api.get<EngineDue>(`/engines/${encodeURIComponent(engineId)}/due`),
    enabled,
  });
}
