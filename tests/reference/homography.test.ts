import fc from 'fast-check';
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { applyHomography } from '../../packages/domain/src/homography';
import { planeHomography } from '../../packages/domain/src/measurement';

type P = [number, number];

/**
 * Independent solution: the unnormalised DLT, solved as the right singular vector of the smallest
 * singular value of the 8×9 system (least squares, ml-matrix's SVD).
 */
function svdHomography(image: P[], plane: P[]): number[] {
  const rows: number[][] = [];
  image.forEach(([x, y], i) => {
    const [u, v] = plane[i]!;
    rows.push([-x, -y, -1, 0, 0, 0, u * x, u * y, u]);
    rows.push([0, 0, 0, -x, -y, -1, v * x, v * y, v]);
  });
  rows.push(new Array(9).fill(0));
  const svd = new SingularValueDecomposition(new Matrix(rows));
  const v = svd.rightSingularVectors;
  const h = v.getColumn(8);
  return h.map((value) => value / h[8]!);
}

function map(h: number[], [x, y]: P): P {
  const w = h[6]! * x + h[7]! * y + h[8]!;
  return [(h[0]! * x + h[1]! * y + h[2]!) / w, (h[3]! * x + h[4]! * y + h[5]!) / w];
}

describe('the plane homography against ml-matrix least squares', () => {
  it('maps image points onto the plane as the SVD solution does, for perspective views of a rectangle', () => {
    // A random plane-to-image projective map G (perspective mild enough that w stays above 0.2 over
    // the rectangle, as in any real view of it) makes the image corners; both
    // solutions must then agree on where any image point lies on the plane.
    const g = fc.record({
      a: fc.double({ min: 5, max: 20, noNaN: true }),
      b: fc.double({ min: -3, max: 3, noNaN: true }),
      c: fc.double({ min: 0, max: 400, noNaN: true }),
      d: fc.double({ min: -3, max: 3, noNaN: true }),
      e: fc.double({ min: 5, max: 20, noNaN: true }),
      f: fc.double({ min: 0, max: 400, noNaN: true }),
      p: fc.double({ min: -0.01, max: 0.01, noNaN: true }),
      q: fc.double({ min: -0.01, max: 0.01, noNaN: true }),
    });
    fc.assert(
      fc.property(
        g,
        fc.double({ min: 5, max: 40, noNaN: true }),
        fc.double({ min: 5, max: 40, noNaN: true }),
        (m, width, height) => {
          const project = ([X, Y]: P): P => {
            const w = m.p * X + m.q * Y + 1;
            return [(m.a * X + m.b * Y + m.c) / w, (m.d * X + m.e * Y + m.f) / w];
          };
          const plane: P[] = [
            [0, 0],
            [width, 0],
            [width, height],
            [0, height],
          ];
          const corners = plane.map(project) as [P, P, P, P];
          const ours = planeHomography({
            kind: 'plane',
            corners,
            widthMm: width,
            heightMm: height,
          });
          const reference = svdHomography(corners, plane);
          for (const [s, t] of [
            [0.5, 0.5],
            [0.1, 0.9],
            [0.8, 0.3],
          ] as P[]) {
            const imagePoint = project([s * width, t * height]);
            const a = applyHomography(ours, imagePoint)!;
            const b = map(reference, imagePoint);
            expect(a[0]).toBeCloseTo(b[0], 6);
            expect(a[1]).toBeCloseTo(b[1], 6);
            expect(a[0]).toBeCloseTo(s * width, 6);
            expect(a[1]).toBeCloseTo(t * height, 6);
          }
        },
      ),
      { numRuns: 200 },
    );
  });
});
