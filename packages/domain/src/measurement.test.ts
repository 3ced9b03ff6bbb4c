import { describe, expect, it } from 'vitest';
import type { Calibration } from '@emberline/contracts/measurement';
import { largestOutline, obliqueView } from './fixtures/largest-shape';
import { measure } from './measurement';

const reference: Calibration = { kind: 'reference', p1: [0, 0], p2: [100, 0], lengthMm: 10 };

describe('reference calibration', () => {
  it('measures a polyline and its uncertainty by the rule of §5.1', () => {
    // Worked by hand: P = 50 px (a 30-40-50 triangle), k = 1 segment, u = 1 px, s = 10/100 mm/px,
    // s_max = 10/(100 − 2) = 5/49; ℓmax = 5/49 × (50 + 2×1×1) = 260/49 mm;
    // uncertainty = 260/49 − 5 = 15/49 ≈ 0.306122 mm.
    const result = measure(reference, {
      kind: 'polyline',
      points: [
        [0, 0],
        [30, 40],
      ],
    });
    expect(result.mmPerPx).toBeCloseTo(0.1, 12);
    expect(result.lengthMm).toBeCloseTo(5, 12);
    expect(result.uncertaintyMm).toBeCloseTo(0.306122448979592, 12);
    expect(result.areaMm2).toBeNull();
    expect(result.uncertaintyMm2).toBeNull();
  });

  it('counts 2u per segment for a polyline of several segments', () => {
    const result = measure(
      reference,
      {
        kind: 'polyline',
        points: [
          [0, 0],
          [10, 0],
          [10, 10],
          [20, 10],
        ],
      },
      2,
    );
    // Worked by hand: P = 30 px, k = 3 segments, u = 2 px, s_max = 10/(100 − 4) = 5/48;
    // ℓmax = 5/48 × (30 + 2×2×3) = 5/48 × 42 = 4.375 mm; uncertainty = 4.375 − 3 = 1.375 mm.
    expect(result.lengthMm).toBeCloseTo(3, 12);
    expect(result.uncertaintyMm).toBeCloseTo(1.375, 12);
  });

  it('measures a polygon: area, perimeter, largest extent and the area uncertainty', () => {
    const result = measure(reference, {
      kind: 'polygon',
      points: [
        [0, 0],
        [10, 0],
        [10, 10],
        [0, 10],
      ],
    });
    expect(result.areaMm2).toBeCloseTo(1, 12);
    expect(result.perimeterMm).toBeCloseTo(4, 12);
    expect(result.maxExtentMm).toBeCloseTo(Math.SQRT2, 12);
    // Worked by hand: A = 100 px², Pp = 40 px, u = 1 px, s_max = 5/49, s_max² = 25/2401;
    // Amax = 25/2401 × (100 + 40 + π) = (3500 + 25π)/2401 ≈ 1.490437 mm²; uncertainty ≈ 0.490437.
    expect(result.uncertaintyMm2).toBeCloseTo(0.490437241291022, 12);
    expect(result.lengthMm).toBeNull();
  });

  it('gives a point its location only', () => {
    expect(measure(reference, { kind: 'point', points: [[5, 5]] })).toEqual({
      mmPerPx: 0.1,
      lengthMm: null,
      areaMm2: null,
      perimeterMm: null,
      maxExtentMm: null,
      uncertaintyMm: null,
      uncertaintyMm2: null,
    });
  });

  it('refuses reference points closer than twice the pick uncertainty, saying how close they are', () => {
    const close: Calibration = { kind: 'reference', p1: [10, 10], p2: [11.2, 10], lengthMm: 1 };
    expect(() =>
      measure(close, {
        kind: 'polyline',
        points: [
          [0, 0],
          [5, 5],
        ],
      }),
    ).toThrowError('the two reference points are only 1.2 px apart');
    expect(() =>
      measure(
        { ...close, p2: [12, 10] },
        {
          kind: 'polyline',
          points: [
            [0, 0],
            [5, 5],
          ],
        },
      ),
    ).toThrowError(/only 2\.0 px apart/);
  });

  it('refuses repeated points and a flat outline', () => {
    expect(() =>
      measure(reference, {
        kind: 'polyline',
        points: [
          [0, 0],
          [0, 0],
          [5, 5],
        ],
      }),
    ).toThrowError(/points 1 and 2 of the polyline are the same point/);
    expect(() =>
      measure(reference, {
        kind: 'polygon',
        points: [
          [0, 0],
          [5, 5],
          [0, 0],
        ],
      }),
    ).toThrowError(/same point/);
    expect(() =>
      measure(reference, {
        kind: 'polygon',
        points: [
          [0, 0],
          [5, 5],
          [10, 10],
        ],
      }),
    ).toThrowError(/no area/);
  });
});

describe('plane calibration', () => {
  const square: Calibration = {
    kind: 'plane',
    corners: [
      [0, 0],
      [100, 0],
      [100, 50],
      [0, 50],
    ],
    widthMm: 10,
    heightMm: 5,
  };

  it('matches the reference method for a rectangle seen square-on', () => {
    const line = measure(square, {
      kind: 'polyline',
      points: [
        [0, 0],
        [30, 40],
      ],
    });
    expect(line.lengthMm).toBeCloseTo(5, 9);
    expect(line.mmPerPx).toBeNull();
    const box = measure(square, {
      kind: 'polygon',
      points: [
        [10, 10],
        [20, 10],
        [20, 20],
        [10, 20],
      ],
    });
    expect(box.areaMm2).toBeCloseTo(1, 9);
    expect(box.perimeterMm).toBeCloseTo(4, 9);
  });

  // Hand-worked example (our own, kept here so it can be checked on paper): the plane-to-image map
  // G = [[10, 0, 0], [0, 10, 0], [0, 0.05, 1]] sends the 10 mm square (0,0), (10,0), (10,10), (0,10)
  // to the image trapezoid (0,0), (100,0), (66.67,66.67), (0,66.67): x = 10X / (0.05Y + 1),
  // y = 10Y / (0.05Y + 1). The plane point (5,5) has w = 1.25 and appears at (40, 40); so the image
  // segment (0,0)–(40,40) is the plane segment (0,0)–(5,5), 5√2 mm long. The vanishing line of the
  // plane is image y = 200 (Y → ∞).
  const trapezoid: Calibration = {
    kind: 'plane',
    corners: [
      [0, 0],
      [100, 0],
      [200 / 3, 200 / 3],
      [0, 200 / 3],
    ],
    widthMm: 10,
    heightMm: 10,
  };

  it('measures on the plane through the homography (hand-worked square-to-trapezoid example)', () => {
    const result = measure(trapezoid, {
      kind: 'polyline',
      points: [
        [0, 0],
        [40, 40],
      ],
    });
    expect(result.lengthMm).toBeCloseTo(5 * Math.SQRT2, 9);
    // The image square (0,0), (40,0), (40,40), (0,40) is, on the plane, Y = y / (10 − 0.05y) and
    // X = x (0.05Y + 1) / 10: the quadrilateral (0,0), (4,0), (5,5), (0,5), of shoelace area 22.5 mm².
    const patch = measure(trapezoid, {
      kind: 'polygon',
      points: [
        [0, 0],
        [40, 0],
        [40, 40],
        [0, 40],
      ],
    });
    expect(patch.areaMm2).toBeCloseTo(22.5, 9);
    expect(patch.perimeterMm).toBeCloseTo(4 + Math.hypot(1, 5) + 5 + 5, 9);
  });

  it('grows the plane uncertainty about linearly with the pick uncertainty, and gives zero for zero', () => {
    const shape = {
      kind: 'polyline' as const,
      points: [
        [10, 10],
        [60, 30],
      ] as [number, number][],
    };
    const one = measure(trapezoid, shape, 1).uncertaintyMm!;
    const two = measure(trapezoid, shape, 2).uncertaintyMm!;
    expect(one).toBeGreaterThan(0);
    expect(two / one).toBeGreaterThan(1.9);
    expect(two / one).toBeLessThan(2.1);
    expect(measure(trapezoid, shape, 0).uncertaintyMm).toBe(0);
  });

  it('refuses a point beyond the horizon of the plane', () => {
    expect(() =>
      measure(trapezoid, {
        kind: 'polyline',
        points: [
          [0, 0],
          [0, 250],
        ],
      }),
    ).toThrowError(/point 2 lies beyond the horizon/);
  });

  it('refuses repeated, collinear and crossed corners', () => {
    const corners = (list: [number, number][]) => ({ ...square, corners: list as never });
    const shape = {
      kind: 'polyline' as const,
      points: [
        [1, 1],
        [5, 5],
      ] as [number, number][],
    };
    expect(() =>
      measure(
        corners([
          [0, 0],
          [0, 0],
          [100, 50],
          [0, 50],
        ]),
        shape,
      ),
    ).toThrowError(/corners 1 and 2 .* only 0\.0 px apart/);
    expect(() =>
      measure(
        corners([
          [0, 0],
          [50, 0],
          [100, 0],
          [0, 50],
        ]),
        shape,
      ),
    ).toThrowError(/lie in a line/);
    expect(() =>
      measure(
        corners([
          [0, 0],
          [100, 50],
          [100, 0],
          [0, 50],
        ]),
        shape,
      ),
    ).toThrowError(/cross or fold/);
  });
});

describe('the cost of a large shape', () => {
  // The most points a shape may have, on an oblique view (contracts: shapeSchema).
  const oblique = obliqueView;
  const circle = largestOutline;

  /** §5.1's plane uncertainty as written: the whole figure measured again for every nudge. */
  function uncertaintyByDefinition(kind: 'polyline' | 'polygon', points: [number, number][]) {
    const figure = (calibration: Calibration, shapePoints: [number, number][]) => {
      const result = measure(calibration, { kind, points: shapePoints }, 0);
      return kind === 'polyline' ? result.lengthMm! : result.areaMm2!;
    };
    const base = figure(oblique, points);
    const nudges = [
      [1, 0],
      [-1, 0],
      [0, 1],
      [0, -1],
    ];
    let total = 0;
    const corners = oblique.kind === 'plane' ? oblique.corners : [];
    corners.forEach((_, corner) => {
      total += Math.max(
        ...nudges.map(([dx, dy]) => {
          const moved = corners.map((p, index): [number, number] =>
            index === corner ? [p[0] + dx!, p[1] + dy!] : p,
          ) as typeof corners;
          return Math.abs(figure({ ...oblique, corners: moved } as Calibration, points) - base);
        }),
      );
    });
    points.forEach((point, index) => {
      total += Math.max(
        ...nudges.map(([dx, dy]) => {
          const moved = points.map((p, i): [number, number] =>
            i === index ? [point[0] + dx!, point[1] + dy!] : p,
          );
          return Math.abs(figure(oblique, moved) - base);
        }),
      );
    });
    return total;
  }

  it('gives the plane uncertainty of the definition, point by point (60-point outline and line)', () => {
    const outline = circle.filter((_, index) => index % 33 === 0);
    const polygon = measure(oblique, { kind: 'polygon', points: outline });
    expect(polygon.uncertaintyMm2).toBeCloseTo(uncertaintyByDefinition('polygon', outline), 9);
    const line = measure(oblique, { kind: 'polyline', points: outline });
    expect(line.uncertaintyMm).toBeCloseTo(uncertaintyByDefinition('polyline', outline), 9);
  });

  it('measures a 2,000-point outline in a few milliseconds (median of 9 under 25 ms)', () => {
    // Comparing every pair of points, or the whole outline again for each of its 8,000 nudges,
    // took about 2 s here; the budget leaves room for a loaded two-core machine.
    const times: number[] = [];
    for (let run = 0; run < 9; run += 1) {
      const started = performance.now();
      measure(oblique, { kind: 'polygon', points: circle });
      measure(oblique, { kind: 'polyline', points: circle });
      times.push(performance.now() - started);
    }
    times.sort((a, b) => a - b);
    expect(times[4]).toBeLessThan(25);
  });
});
