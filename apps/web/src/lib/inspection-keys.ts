/**
 * The query keys of inspections, generic to specific. Findings, coverage and the limit library
 * change what an inspection shows, so they invalidate these keys too.
 */
export const inspectionKeys = {
  all: ['inspections'] as const,
  lists: () => [...inspectionKeys.all, 'list'] as const,
  list: (engineId: string) => [...inspectionKeys.lists(), engineId] as const,
  detail: (id: string) => [...inspectionKeys.all, 'detail', id] as const,
};
