import { describe, expect, it } from 'vitest';
import type { Decision } from '@emberline/contracts/review';
import {
  decisionOutcome,
  defaultDecision,
  isConcession,
  type VerdictForDecision,
} from './decisions';

// Invented intervals and actions; nothing here comes from an engine manual.
const repeat: VerdictForDecision = {
  category: 'repeat-inspection',
  repeatInterval: { cycles: 400, hours: null, days: 90 },
  beyondAction: null,
};
const beyond: VerdictForDecision = {
  category: 'beyond-limits',
  repeatInterval: null,
  beyondAction: { kind: 'remove-within', cycles: 50, hours: null },
};
const review: VerdictForDecision = { category: 'review', repeatInterval: null, beyondAction: null };

describe('the default decision of a verdict', () => {
  it('maps serviceable, repeat and beyond limits, and gives none for review', () => {
    expect(
      defaultDecision({ category: 'serviceable', repeatInterval: null, beyondAction: null }),
    ).toEqual({ kind: 'serviceable' });
    expect(defaultDecision(repeat)).toEqual({
      kind: 'repeat-inspection',
      repeatInterval: { cycles: 400, hours: null, days: 90 },
    });
    expect(defaultDecision(beyond)).toEqual({
      kind: 'remove',
      action: { kind: 'remove-within', cycles: 50, hours: null },
    });
    expect(defaultDecision(review)).toBeNull();
  });
});

describe('concessions', () => {
  const repeatAt = (cycles: number | null, days: number | null, hours: number | null = null) =>
    ({ kind: 'repeat-inspection', repeatInterval: { cycles, hours, days } }) as Decision;

  it('calls a better category a concession and a worse one stricter', () => {
    expect(isConcession({ kind: 'serviceable' }, repeat)).toBe(true);
    expect(isConcession(repeatAt(400, 90), beyond)).toBe(true);
    expect(
      isConcession(
        {
          kind: 'remove',
          action: { kind: 'remove-before-next-flight', cycles: null, hours: null },
        },
        repeat,
      ),
    ).toBe(false);
  });

  it('calls a longer or missing repeat dimension a concession, a shorter or added one not', () => {
    expect(isConcession(repeatAt(400, 90), repeat)).toBe(false);
    expect(isConcession(repeatAt(401, 90), repeat)).toBe(true);
    expect(isConcession(repeatAt(400, null), repeat)).toBe(true);
    expect(isConcession(repeatAt(200, 30, 100), repeat)).toBe(false);
  });

  it('orders removals: before the next flight, then within fewest cycles, then at the next shop visit', () => {
    const within = (cycles: number) =>
      ({ kind: 'remove', action: { kind: 'remove-within', cycles, hours: null } }) as Decision;
    expect(isConcession(within(50), beyond)).toBe(false);
    expect(isConcession(within(20), beyond)).toBe(false);
    expect(isConcession(within(51), beyond)).toBe(true);
    expect(
      isConcession(
        {
          kind: 'remove',
          action: { kind: 'remove-at-next-shop-visit', cycles: null, hours: null },
        },
        beyond,
      ),
    ).toBe(true);
  });

  it('calls serviceable a concession for a review verdict, and anything stricter not', () => {
    expect(isConcession({ kind: 'serviceable' }, review)).toBe(true);
    expect(isConcession(repeatAt(100, null), review)).toBe(false);
  });
});

describe('the outcome of the current decisions', () => {
  it('takes the smallest repeat dimensions and lists removals most restrictive first', () => {
    const outcome = decisionOutcome([
      { kind: 'repeat-inspection', repeatInterval: { cycles: 400, hours: null, days: 90 } },
      { kind: 'repeat-inspection', repeatInterval: { cycles: 250, hours: 600, days: null } },
      { kind: 'remove', action: { kind: 'remove-at-next-shop-visit', cycles: null, hours: null } },
      { kind: 'remove', action: { kind: 'remove-within', cycles: 30, hours: null } },
      { kind: 'serviceable' },
    ]);
    expect(outcome).toEqual({
      kind: 'remove',
      repeatInterval: { cycles: 250, hours: 600, days: 90 },
      removals: [
        { kind: 'remove-within', cycles: 30, hours: null },
        { kind: 'remove-at-next-shop-visit', cycles: null, hours: null },
      ],
    });
    expect(decisionOutcome([{ kind: 'serviceable' }])).toEqual({
      kind: 'serviceable',
      repeatInterval: null,
      removals: [],
    });
  });
});
