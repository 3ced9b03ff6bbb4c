import type { Category, Interval } from '@emberline/contracts/limits';
import { severity } from './limits';

export interface VerdictAt {
  category: Category | null;
  repeatInterval: Interval | null;
}

export type VerdictChange = 'same' | 'stricter' | 'relaxed';

const intervalKeys = ['cycles', 'hours', 'days'] as const;

/**
 * How a finding's verdict moves from one revision to another. Relaxed: a less severe category, or
 * the same repeat inspection with a longer interval or a limit dropped; those are the changes that
 * could make damaged engines look better than they are. A finding never judged before is stricter
 * whatever it becomes, so that it is listed.
 */
export function verdictChange(before: VerdictAt, after: VerdictAt): VerdictChange {
  if (after.category === null) return before.category === null ? 'same' : 'relaxed';
  if (before.category === null) return 'stricter';
  if (before.category !== after.category)
    return severity(after.category) < severity(before.category) ? 'relaxed' : 'stricter';
  if (before.category !== 'repeat-inspection') return 'same';
  const was = before.repeatInterval;
  const now = after.repeatInterval;
  let change: VerdictChange = 'same';
  for (const key of intervalKeys) {
    const a = was?.[key] ?? null;
    const b = now?.[key] ?? null;
    if (a === b) continue;
    // A limit that goes away, or grows, lets the engine run longer before it is seen again.
    if (b === null || (a !== null && b > a)) return 'relaxed';
    change = 'stricter';
  }
  return change;
}
