import { describe, expect, it } from 'vitest';
import { isoDateSchema } from './forecast';

describe('a day as the API takes it', () => {
  it('takes real days between 1900 and 2200 and refuses the rest in words', () => {
    expect(isoDateSchema.parse('2026-12-04')).toBe('2026-12-04');
    expect(isoDateSchema.parse('1900-01-01')).toBe('1900-01-01');
    expect(isoDateSchema.parse('2200-12-31')).toBe('2200-12-31');
    // 2100 is not a leap year (Gregorian rule: centuries only when divisible by 400).
    expect(isoDateSchema.safeParse('2100-02-29').success).toBe(false);
    expect(isoDateSchema.safeParse('2000-02-29').success).toBe(true);
    for (const outside of ['1899-12-31', '2201-01-01', '0001-01-01', '9999-12-31']) {
      const result = isoDateSchema.safeParse(outside);
      expect(result.success).toBe(false);
      expect(result.error?.issues[0]?.message).toBe('give a day between 1900 and 2200');
    }
  });
});
