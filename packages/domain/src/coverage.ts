import type { CoverageStatus } from '@emberline/contracts/findings';
import type { Category, EngineVerdict } from '@emberline/contracts/limits';
import { DomainError } from './errors';
import { worse } from './limits';

export interface CoverageState {
  status: CoverageStatus;
  viewedPositions: readonly number[];
  noDamageFound: boolean;
  reason: string;
}

/**
 * Checks a row's coverage and returns it in its normal form: a partly viewed row lists the
 * positions seen (sorted, each once, inside the row and not all of them); a fully viewed or not
 * viewed row lists none. "No damage found" needs the row to have been viewed and no findings on it.
 */
export function normaliseCoverage(
  input: CoverageState,
  row: { key: string; count: number },
  findingsOnRow: number,
): CoverageState {
  const reason = input.reason.trim();
  if (input.noDamageFound && input.status === 'none')
    throw new DomainError(`${row.key} was not viewed, so it cannot be "no damage found"`, [
      'noDamageFound',
    ]);
  if (input.noDamageFound && findingsOnRow > 0)
    throw new DomainError(
      `${row.key} has ${findingsOnRow} recorded finding${findingsOnRow === 1 ? '' : 's'}, so it cannot be "no damage found"; void ${findingsOnRow === 1 ? 'it' : 'them'} first if recorded by mistake`,
      ['noDamageFound'],
    );
  if (input.status !== 'partial') {
    return {
      status: input.status,
      viewedPositions: [],
      noDamageFound: input.noDamageFound,
      reason,
    };
  }
  const positions = [...new Set(input.viewedPositions)].sort((a, b) => a - b);
  if (positions.length === 0)
    throw new DomainError(`List the positions of ${row.key} that were viewed`, ['viewedPositions']);
  const outside = positions.find((position) => position < 1 || position > row.count);
  if (outside !== undefined)
    throw new DomainError(
      `Position ${outside} is outside ${row.key}, which has positions 1 to ${row.count}`,
      ['viewedPositions'],
    );
  if (positions.length === row.count)
    throw new DomainError(
      `Every position of ${row.key} is listed: record the row as fully viewed`,
      ['status'],
    );
  return {
    status: 'partial',
    viewedPositions: positions,
    noDamageFound: input.noDamageFound,
    reason,
  };
}

/**
 * A listed row is a gap when it is not fully viewed and no reason is given; a row whose coverage
 * was never recorded counts as not viewed.
 */
export function isCoverageGap(coverage: CoverageState | null): boolean {
  return !coverage || (coverage.status !== 'full' && coverage.reason.trim() === '');
}

/**
 * The category of an inspection: the worst verdict of its findings, but never better than review
 * while a listed row is a gap (DESIGN §3: an unviewed row cannot make the engine look serviceable).
 */
export function inspectionCategory(
  verdict: Pick<EngineVerdict, 'category'>,
  gaps: number,
): Category {
  return gaps > 0 ? worse(verdict.category, 'review') : verdict.category;
}

/** The positions of a row left unviewed by its coverage. */
export function unviewedPositions(coverage: CoverageState | null, count: number): number[] {
  if (coverage?.status === 'full') return [];
  const seen = new Set(coverage?.status === 'partial' ? coverage.viewedPositions : []);
  return Array.from({ length: count }, (_, index) => index + 1).filter((p) => !seen.has(p));
}
