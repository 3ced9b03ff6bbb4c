/**
 * The query keys of inspections, generic to specific. Findings, coverage and the limit library
 * change what an inspection shows, so they invalidate these keys too.
 */
export const inspectionKeys = {
  all: ['inspections'] as const,
  lists: () => [...inspectionKeys.all, 'list'] as const,
  list: (engineId: string) => [...inspectionKeys.lists(), engineId] as const,
  detail: (id: string) => [...inspectionKeys.all, 'detail', id] as const,
  /** The review of one inspection: dispositions, outcomes, releases, withdrawals. */
  review: (id: string) => [...inspectionKeys.all, 'review', id] as const,
  queue: (filters: object) => [...inspectionKeys.all, 'queue', filters] as const,
};
