import { describe, expect, it } from 'vitest';
import {
  inspectionCategory,
  isCoverageGap,
  normaliseCoverage,
  unviewedPositions,
} from './coverage';

const row = { key: 'hpt1-ngv', count: 38 };
const base = { viewedPositions: [], noDamageFound: false, reason: '' };

describe('row coverage', () => {
  it('sorts and de-duplicates the positions of a partly viewed row', () => {
    const result = normaliseCoverage(
      { ...base, status: 'partial', viewedPositions: [5, 3, 5, 1] },
      row,
      0,
    );
    expect(result.viewedPositions).toEqual([1, 3, 5]);
  });

  it('drops positions from a fully viewed row', () => {
    expect(
      normaliseCoverage({ ...base, status: 'full', viewedPositions: [4] }, row, 0).viewedPositions,
    ).toEqual([]);
  });

  it('refuses a partial row without positions, outside the row, or with every position', () => {
    expect(() => normaliseCoverage({ ...base, status: 'partial' }, row, 0)).toThrow(
      /List the positions/,
    );
    expect(() =>
      normaliseCoverage({ ...base, status: 'partial', viewedPositions: [39] }, row, 0),
    ).toThrow(/Position 39 is outside hpt1-ngv/);
    const all = Array.from({ length: 38 }, (_, index) => index + 1);
    expect(() =>
      normaliseCoverage({ ...base, status: 'partial', viewedPositions: all }, row, 0),
    ).toThrow(/fully viewed/);
  });

  it('refuses "no damage found" on a row with findings or a row not viewed', () => {
    expect(() =>
      normaliseCoverage({ ...base, status: 'full', noDamageFound: true }, row, 2),
    ).toThrow(/has 2 recorded findings/);
    expect(() =>
      normaliseCoverage({ ...base, status: 'none', noDamageFound: true }, row, 0),
    ).toThrow(/not viewed/);
  });

  it('counts a row as a gap until it is fully viewed or the reason is stated', () => {
    expect(isCoverageGap(null)).toBe(true);
    expect(isCoverageGap({ ...base, status: 'partial', viewedPositions: [1] })).toBe(true);
    expect(isCoverageGap({ ...base, status: 'none', reason: '  ' })).toBe(true);
    expect(
      isCoverageGap({ ...base, status: 'none', reason: 'Port BP-4 blocked by a bracket' }),
    ).toBe(false);
    expect(isCoverageGap({ ...base, status: 'full' })).toBe(false);
  });

  it('keeps a gap from making the inspection better than review', () => {
    expect(inspectionCategory({ category: 'serviceable' }, 1)).toBe('review');
    expect(inspectionCategory({ category: 'repeat-inspection' }, 1)).toBe('review');
    expect(inspectionCategory({ category: 'beyond-limits' }, 1)).toBe('beyond-limits');
    expect(inspectionCategory({ category: 'serviceable' }, 0)).toBe('serviceable');
  });

  it('lists the positions left unviewed', () => {
    expect(unviewedPositions({ ...base, status: 'partial', viewedPositions: [1, 2] }, 4)).toEqual([
      3, 4,
    ]);
    expect(unviewedPositions(null, 3)).toEqual([1, 2, 3]);
    expect(unviewedPositions({ ...base, status: 'full' }, 3)).toEqual([]);
  });
});
