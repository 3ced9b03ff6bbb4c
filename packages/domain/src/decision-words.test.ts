import { describe, expect, it } from 'vitest';
import { actionWords, decisionWords, intervalWords } from './decision-words';

describe('decisions in words', () => {
  it('names each given dimension of an interval, thousands separated', () => {
    expect(intervalWords({ cycles: 400, hours: 1200, days: null })).toBe(
      '400 cycles or 1,200 hours',
    );
    expect(intervalWords(null)).toBe('');
  });

  it('says each removal and decision as a person would', () => {
    expect(actionWords({ kind: 'remove-within', cycles: 50, hours: null })).toBe(
      'remove within 50 cycles',
    );
    expect(
      decisionWords({
        kind: 'remove',
        action: { kind: 'remove-before-next-flight', cycles: null, hours: null },
      }),
    ).toBe('Remove from service: remove before the next flight');
    expect(
      decisionWords({
        kind: 'repeat-inspection',
        repeatInterval: { cycles: null, hours: null, days: 90 },
      }),
    ).toBe('Serviceable; repeat inspection within 90 days');
  });
});
