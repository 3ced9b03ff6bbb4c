import { z } from 'zod';

/**
 * Every list the API answers with is a page (DESIGN §6): `page` from 1 and `pageSize` up to a
 * documented maximum in the query, and `items`, `total`, `page` and `pageSize` in the answer. The
 * only lists that are not paged are an inspection's own children (its findings, images, coverage
 * and dispositions), which the evaluation needs whole and the upload limits bound.
 */
export const MAX_PAGE_SIZE = 200;

/** The paging fields of a list's query, with the list's own default page size. */
export const pageQueryFields = (defaultPageSize = 50, maxPageSize = MAX_PAGE_SIZE) => ({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  /** At most `maxPageSize` a page. */
  pageSize: z.coerce.number().int().min(1).max(maxPageSize).default(defaultPageSize),
});

/** A query of paging alone, for a list with no filters. */
export const pageQuerySchema = z.strictObject(pageQueryFields());
export type PageQuery = z.output<typeof pageQuerySchema>;

/** The answer of a list: one page of `item`, and how many there are in all. */
export const pageOf = <T extends z.ZodType>(item: T) =>
  z.object({
    items: z.array(item),
    total: z.number().int(),
    page: z.number().int(),
    pageSize: z.number().int(),
  });

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/** The rows of `page` to skip (SQL's OFFSET). */
export const offsetOf = (query: { page: number; pageSize: number }) =>
  (query.page - 1) * query.pageSize;

/** One page of a list computed whole in memory (one of a few dozen, such as a finding's series). */
export function pageOfList<T>(
  all: readonly T[],
  query: { page: number; pageSize: number },
): Page<T> {
  const start = offsetOf(query);
  return {
    items: all.slice(start, start + query.pageSize),
    total: all.length,
    page: query.page,
    pageSize: query.pageSize,
  };
}
