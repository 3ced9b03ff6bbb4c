import { describe, expect, it } from 'vitest';
import { verdictChange } from './impact';

const repeat = (cycles: number | null, hours: number | null = null) => ({
  category: 'repeat-inspection' as const,
  repeatInterval: { cycles, hours, days: null },
});

describe('verdictChange', () => {
  it('calls a less severe category relaxed and a more severe one stricter', () => {
    const beyond = { category: 'beyond-limits' as const, repeatInterval: null };
    const serviceable = { category: 'serviceable' as const, repeatInterval: null };
    expect(verdictChange(beyond, serviceable)).toBe('relaxed');
    expect(verdictChange(serviceable, beyond)).toBe('stricter');
    expect(verdictChange(repeat(200), { category: 'review', repeatInterval: null })).toBe(
      'stricter',
    );
    expect(verdictChange(serviceable, serviceable)).toBe('same');
  });

  it('compares repeat intervals limit by limit', () => {
    expect(verdictChange(repeat(200), repeat(200))).toBe('same');
    expect(verdictChange(repeat(200), repeat(100))).toBe('stricter');
    expect(verdictChange(repeat(100), repeat(200))).toBe('relaxed');
    // Dropping the hours limit lets the engine run longer, even with fewer cycles.
    expect(verdictChange(repeat(200, 500), repeat(100))).toBe('relaxed');
    expect(verdictChange(repeat(200), repeat(200, 400))).toBe('stricter');
  });

  it('lists a finding judged for the first time as stricter', () => {
    const never = { category: null, repeatInterval: null };
    expect(verdictChange(never, repeat(100))).toBe('stricter');
    expect(verdictChange(never, never)).toBe('same');
    expect(verdictChange(repeat(100), never)).toBe('relaxed');
  });
});
