import { polygonArea as d3Area, polygonLength as d3Length } from 'd3-polygon';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { measure } from '../../packages/domain/src/measurement';

// Reference library: d3-polygon (polygonArea is the signed shoelace area, polygonLength the closed
// perimeter). With a reference calibration of 1 mm per px the product's figures are pixel figures.
const unit = {
  kind: 'reference' as const,
  p1: [0, 0] as [number, number],
  p2: [1000, 0] as [number, number],
  lengthMm: 1000,
};
const point = fc.tuple(
  fc.double({ min: -500, max: 500, noNaN: true }),
  fc.double({ min: -500, max: 500, noNaN: true }),
);

describe('lengths and areas against d3-polygon', () => {
  it('agrees on polygon area and perimeter', () => {
    fc.assert(
      fc.property(fc.array(point, { minLength: 3, maxLength: 12 }), (points) => {
        let result;
        try {
          result = measure(unit, { kind: 'polygon', points }, 0);
        } catch {
          return true;
        }
        expect(result.areaMm2).toBeCloseTo(Math.abs(d3Area(points)), 6);
        expect(result.perimeterMm).toBeCloseTo(d3Length(points), 6);
        return true;
      }),
      { numRuns: 500 },
    );
  });

  it('agrees on polyline length (d3 closed perimeter less the closing segment)', () => {
    fc.assert(
      fc.property(fc.array(point, { minLength: 2, maxLength: 12 }), (points) => {
        let result;
        try {
          result = measure(unit, { kind: 'polyline', points }, 0);
        } catch {
          return true;
        }
        const first = points[0]!;
        const last = points[points.length - 1]!;
        const closing = Math.hypot(first[0] - last[0], first[1] - last[1]);
        expect(result.lengthMm).toBeCloseTo(d3Length(points) - closing, 6);
        return true;
      }),
      { numRuns: 500 },
    );
  });
});
