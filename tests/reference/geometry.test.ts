import { polygonArea as d3Area, polygonHull, polygonLength as d3Length } from 'd3-polygon';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DomainError } from '../../packages/domain/src/errors';
import { measure } from '../../packages/domain/src/measurement';

// Reference library: d3-polygon (polygonArea is the signed shoelace area, polygonLength the closed
// perimeter). With a reference calibration of 1 mm per px the product's figures are pixel figures.
const unit = {
  kind: 'reference' as const,
  p1: [0, 0] as [number, number],
  p2: [1000, 0] as [number, number],
  lengthMm: 1000,
};
/** The same point twice in a row (and, for an outline, last = first). */
function repeatsAPoint(points: [number, number][], closed: boolean): boolean {
  const pairs = closed ? points.length : points.length - 1;
  return Array.from({ length: pairs }, (_, index) => index).some((index) => {
    const [a, b] = [points[index]!, points[(index + 1) % points.length]!];
    return a[0] === b[0] && a[1] === b[1];
  });
}

// Image points to a thousandth of a pixel (finer than any pick), and a small integer grid that
// makes repeated points and flat outlines common enough to test the refusals.
const coordinate = fc.integer({ min: -500_000, max: 500_000 }).map((value) => value / 1000);
const gridPoint = fc.tuple(fc.integer({ min: -2, max: 2 }), fc.integer({ min: -2, max: 2 }));
const finePoint = fc.tuple(coordinate, coordinate);
const shapePoints = (minLength: number) =>
  fc.oneof(
    fc.array(gridPoint, { minLength, maxLength: 12 }),
    fc.array(finePoint, { minLength, maxLength: 12 }),
  );

describe('lengths and areas against d3-polygon', () => {
  it('agrees on polygon area and perimeter', () => {
    fc.assert(
      fc.property(shapePoints(3), (points) => {
        // An outline with the same point twice in a row, or with no area, must be refused. An area
        // within rounding of zero (a self-crossing outline whose lobes cancel) may go either way.
        const area = d3Area(points);
        fc.pre(area === 0 || Math.abs(area) >= 1e-6);
        if (repeatsAPoint(points, true) || area === 0) {
          expect(() => measure(unit, { kind: 'polygon', points }, 0)).toThrow(DomainError);
          return;
        }
        const result = measure(unit, { kind: 'polygon', points }, 0);
        expect(result.areaMm2).toBeCloseTo(Math.abs(d3Area(points)), 6);
        expect(result.perimeterMm).toBeCloseTo(d3Length(points), 6);
      }),
      { numRuns: 500 },
    );
  });

  it('agrees on polyline length (d3 closed perimeter less the closing segment)', () => {
    fc.assert(
      fc.property(shapePoints(2), (points) => {
        if (repeatsAPoint(points, false)) {
          expect(() => measure(unit, { kind: 'polyline', points }, 0)).toThrow(DomainError);
          return;
        }
        const result = measure(unit, { kind: 'polyline', points }, 0);
        const first = points[0]!;
        const last = points[points.length - 1]!;
        const closing = Math.hypot(first[0] - last[0], first[1] - last[1]);
        expect(result.lengthMm).toBeCloseTo(d3Length(points) - closing, 6);
      }),
      { numRuns: 500 },
    );
  });
});

describe('largest extent against a pair-by-pair scan and d3-polygon hull', () => {
  // Reference: every pair of points compared (the definition of §5.1, "largest vertex-to-vertex
  // distance"), and d3-polygon's polygonHull, whose points must hold the farthest pair.
  it('agrees on random outlines', () => {
    fc.assert(
      fc.property(fc.array(finePoint, { minLength: 3, maxLength: 40 }), (points) => {
        fc.pre(!repeatsAPoint(points, true) && d3Area(points) !== 0);
        let largest = 0;
        for (const a of points)
          for (const b of points) largest = Math.max(largest, Math.hypot(a[0] - b[0], a[1] - b[1]));
        const hull = polygonHull(points)!;
        let hullLargest = 0;
        for (const a of hull)
          for (const b of hull)
            hullLargest = Math.max(hullLargest, Math.hypot(a[0] - b[0], a[1] - b[1]));
        const result = measure(unit, { kind: 'polygon', points });
        expect(result.maxExtentMm).toBeCloseTo(largest, 6);
        expect(result.maxExtentMm).toBeCloseTo(hullLargest, 6);
      }),
      { numRuns: 500 },
    );
  });
});
