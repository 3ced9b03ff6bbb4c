import {
  findingExportLimit,
  type FindingSearchResponse,
  type FindingSearchSelection,
  type ParsedFindingSearchQuery,
} from '@emberline/contracts/fleet-findings';
import type { AppContext } from '../../context';
import type { Principal } from '../../http/principal';
import { recordScope } from '../../http/record-access';
import { searchFindings } from './fleet-findings.repository';

/**
 * The fleet findings search: every recorded finding the caller may see (staff: every
 * organisation's inspections that hold records; an owner: their own released ones, with the
 * decisions as released), filtered, sorted and paged in SQL.
 */
export function createFleetFindingsService(ctx: Pick<AppContext, 'db'>) {
  return {
    search(principal: Principal, query: ParsedFindingSearchQuery): FindingSearchResponse {
      const { page, pageSize, ...selection } = query;
      const { items, total } = searchFindings(ctx.db, recordScope(principal), selection, {
        offset: (page - 1) * pageSize,
        limit: pageSize,
      });
      return { items, total, page, pageSize };
    },

    /** The ids of every match in the search's order, for an export: at most `findingExportLimit`. */
    matchingIds(
      principal: Principal,
      selection: FindingSearchSelection,
    ): { ids: string[]; total: number } {
      const { items, total } = searchFindings(ctx.db, recordScope(principal), selection, {
        offset: 0,
        limit: findingExportLimit,
      });
      return { ids: items.map((item) => item.id), total };
    },
  };
}
