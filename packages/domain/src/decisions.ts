import type { BeyondAction, Category, Interval } from '@emberline/contracts/limits';
import type { Decision } from '@emberline/contracts/review';
import { compareActions, strictestInterval } from './limits';

/** The verdict of a finding as the disposition needs it. */
export interface VerdictForDecision {
  category: Category;
  repeatInterval: Interval | null;
  beyondAction: BeyondAction | null;
}

/**
 * The decision a verdict calls for (DESIGN §5.5): serviceable → serviceable, repeat-inspection →
 * its interval, beyond-limits → removal with its action. A `review` verdict has none: the engineer
 * decides, or sends the inspection back to be measured again.
 */
export function defaultDecision(verdict: VerdictForDecision): Decision | null {
  switch (verdict.category) {
    case 'serviceable':
      return { kind: 'serviceable' };
    case 'repeat-inspection':
      return verdict.repeatInterval
        ? { kind: 'repeat-inspection', repeatInterval: verdict.repeatInterval }
        : null;
    case 'beyond-limits':
      return verdict.beyondAction ? { kind: 'remove', action: verdict.beyondAction } : null;
    case 'review':
      return null;
  }
}

const severity: Record<Decision['kind'], number> = {
  serviceable: 0,
  'repeat-inspection': 1,
  remove: 2,
};

/** A dimension of `given` that is looser than `required`: larger, or missing where it is set. */
function looserInterval(given: Interval, required: Interval): boolean {
  return (['cycles', 'hours', 'days'] as const).some((dimension) => {
    const limit = required[dimension];
    if (limit === null) return false;
    const value = given[dimension];
    return value === null || value > limit * (1 + 1e-9);
  });
}

/**
 * Whether a decision is a concession: looser than the verdict's default in any respect (a better
 * category, a longer or missing repeat dimension, a later removal); for a `review` verdict, calling
 * it serviceable. A concession needs the reference of whoever granted it. Stricter is always allowed.
 */
export function isConcession(decision: Decision, verdict: VerdictForDecision): boolean {
  const required = defaultDecision(verdict);
  if (!required) return decision.kind === 'serviceable';
  const difference = severity[decision.kind] - severity[required.kind];
  if (difference !== 0) return difference < 0;
  if (decision.kind === 'repeat-inspection' && required.kind === 'repeat-inspection')
    return looserInterval(decision.repeatInterval, required.repeatInterval);
  if (decision.kind === 'remove' && required.kind === 'remove')
    return compareActions(decision.action, required.action) > 0;
  return false;
}

/** The engine-level outcome of the current decisions: the repeat interval and removals to act on. */
export interface DecisionOutcome {
  /** The worst decision: remove, repeat-inspection or serviceable. */
  kind: Decision['kind'];
  /** The smallest of each dimension over the repeat decisions; null without one. */
  repeatInterval: Interval | null;
  /** Every removal action, most restrictive first. */
  removals: BeyondAction[];
}

export function decisionOutcome(decisions: readonly Decision[]): DecisionOutcome {
  const repeatIntervals = decisions.flatMap((decision) =>
    decision.kind === 'repeat-inspection' ? [decision.repeatInterval] : [],
  );
  const removals = decisions
    .flatMap((decision) => (decision.kind === 'remove' ? [decision.action] : []))
    .sort(compareActions);
  const kind = removals.length
    ? 'remove'
    : repeatIntervals.length
      ? 'repeat-inspection'
      : 'serviceable';
  return { kind, repeatInterval: strictestInterval(repeatIntervals), removals };
}
