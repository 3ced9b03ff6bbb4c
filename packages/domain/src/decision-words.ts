import type { BeyondAction, Interval } from '@emberline/contracts/limits';
import type { Decision } from '@emberline/contracts/review';

const number = (value: number) => value.toLocaleString('en-GB', { maximumFractionDigits: 1 });

/** An interval in words: "400 cycles or 1,000 hours", the earliest governing. Empty without one. */
export function intervalWords(interval: Interval | null): string {
  if (!interval) return '';
  return [
    interval.cycles !== null ? `${number(interval.cycles)} cycles` : null,
    interval.hours !== null ? `${number(interval.hours)} hours` : null,
    interval.days !== null ? `${number(interval.days)} days` : null,
  ]
    .filter(Boolean)
    .join(' or ');
}

/** A removal in words: "remove before the next flight", "remove within 50 cycles". */
export function actionWords(action: BeyondAction): string {
  switch (action.kind) {
    case 'remove-before-next-flight':
      return 'remove before the next flight';
    case 'remove-at-next-shop-visit':
      return 'remove at the next shop visit';
    case 'remove-within':
      return `remove within ${intervalWords({ cycles: action.cycles, hours: action.hours, days: null })}`;
  }
}

/** A decision in words, as a disposition list and an e-mail show it. */
export function decisionWords(decision: Decision): string {
  switch (decision.kind) {
    case 'serviceable':
      return 'Serviceable';
    case 'repeat-inspection':
      return `Serviceable; repeat inspection within ${intervalWords(decision.repeatInterval)}`;
    case 'remove':
      return `Remove from service: ${actionWords(decision.action)}`;
  }
}

/** What a removal requirement asks, in words, without its figures (shown beside its due date). */
export const removalKindWords: Record<BeyondAction['kind'], string> = {
  'remove-before-next-flight': 'Remove before the next flight',
  'remove-within': 'Remove within the cycles or hours set',
  'remove-at-next-shop-visit': 'Remove at the next shop visit',
};
