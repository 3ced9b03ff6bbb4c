import { describe, expect, it } from 'vitest';
import type { Calibration } from '@emberline/contracts/measurement';
import { formatPositions, liveMeasurement, parsePositions } from './live';

describe('positions typed by the inspector', () => {
  it('reads single positions and ranges, sorted and once each', () => {
    expect(parsePositions('20, 1-3 2', 38)).toEqual({ value: [1, 2, 3, 20], error: null });
    expect(formatPositions([1, 2, 3, 5, 7, 8])).toBe('1-3, 5, 7-8');
  });

  it('says what is wrong with a bad entry', () => {
    expect(parsePositions('1-40', 38).error).toMatch(/outside positions 1 to 38/);
    expect(parsePositions('a few', 38).error).toMatch(/not a position/);
  });
});

describe('live measurement', () => {
  it('measures with the shared code and reports degenerate input as a message', () => {
    const calibration: Calibration = { kind: 'reference', p1: [0, 0], p2: [400, 0], lengthMm: 4 };
    const result = liveMeasurement(
      calibration,
      {
        kind: 'polyline',
        points: [
          [0, 0],
          [100, 0],
        ],
      },
      1,
    );
    expect(result?.value?.lengthMm).toBeCloseTo(1, 12);
    const degenerate = liveMeasurement(
      calibration,
      {
        kind: 'polyline',
        points: [
          [5, 5],
          [5, 5],
        ],
      },
      1,
    );
    expect(degenerate?.error).toMatch(/same point/);
    expect(
      liveMeasurement(
        null,
        {
          kind: 'polyline',
          points: [
            [0, 0],
            [1, 1],
          ],
        },
        1,
      ),
    ).toBeNull();
  });
});
