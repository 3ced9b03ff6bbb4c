import type { Reason } from '@emberline/contracts/limits';

/** The reasons of a verdict in the inspector's words. */
export const reasonLabels: Record<Reason, string> = {
  'not-permitted': 'not permitted in this zone',
  'count-rule-only': 'judged by its count limits only',
  'missing-measurement': 'the measurement the rule needs is missing',
  'within-serviceable': 'within the serviceable limit',
  'within-repeat': 'within the repeat-inspection limit',
  'exceeds-limit': 'beyond the repeat-inspection limit',
  'no-matching-rule': 'no rule of the limit set covers it',
  'count-per-airfoil': 'too many findings on one airfoil',
  'total-per-airfoil': 'total on one airfoil over its limit',
  'airfoils-per-row': 'too many airfoils of the row affected',
  'adjacent-airfoils': 'too many adjacent airfoils affected',
};
