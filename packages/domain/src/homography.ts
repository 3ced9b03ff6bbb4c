import { DomainError } from './errors';
import { distance, turn, type Point } from './geometry';

/** A 3×3 projective transform, row-major. */
export type Homography = readonly [
  number,
  number,
  number,
  number,
  number,
  number,
  number,
  number,
  number,
];

/** Applies H to a point; null when the point maps to or beyond the line at infinity. */
export function applyHomography(h: Homography, [x, y]: Point): Point | null {
  const w = h[6] * x + h[7] * y + h[8];
  if (Math.abs(w) < 1e-12) return null;
  return [(h[0] * x + h[1] * y + h[2]) / w, (h[3] * x + h[4] * y + h[5]) / w];
}

/** The denominator w of H at a point: its sign says on which side of the horizon the point lies. */
export function homogeneousScale(h: Homography, [x, y]: Point): number {
  return h[6] * x + h[7] * y + h[8];
}

function multiply(a: readonly number[], b: readonly number[]): number[] {
  const out = new Array<number>(9).fill(0);
  for (let r = 0; r < 3; r += 1)
    for (let c = 0; c < 3; c += 1)
      for (let k = 0; k < 3; k += 1) out[r * 3 + c]! += a[r * 3 + k]! * b[k * 3 + c]!;
  return out;
}

/**
 * Hartley normalisation: translate the centroid to the origin and scale so the mean distance from it
 * is √2. Returns the transform and its inverse, row-major.
 */
function normalisation(points: readonly Point[]): { t: number[]; inverse: number[] } {
  const cx = points.reduce((sum, p) => sum + p[0], 0) / points.length;
  const cy = points.reduce((sum, p) => sum + p[1], 0) / points.length;
  const mean = points.reduce((sum, p) => sum + Math.hypot(p[0] - cx, p[1] - cy), 0) / points.length;
  const s = Math.SQRT2 / mean;
  return {
    t: [s, 0, -s * cx, 0, s, -s * cy, 0, 0, 1],
    inverse: [1 / s, 0, cx, 0, 1 / s, cy, 0, 0, 1],
  };
}

/** Solves A x = b (n×n) by Gaussian elimination with partial pivoting; null when singular. */
function solve(a: number[][], b: number[]): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]!]);
  for (let col = 0; col < n; col += 1) {
    let pivot = col;
    for (let row = col + 1; row < n; row += 1)
      if (Math.abs(m[row]![col]!) > Math.abs(m[pivot]![col]!)) pivot = row;
    if (Math.abs(m[pivot]![col]!) < 1e-12) return null;
    [m[col], m[pivot]] = [m[pivot]!, m[col]!];
    for (let row = col + 1; row < n; row += 1) {
      const factor = m[row]![col]! / m[col]![col]!;
      for (let k = col; k <= n; k += 1) m[row]![k]! -= factor * m[col]![k]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let row = n - 1; row >= 0; row -= 1) {
    let sum = m[row]![n]!;
    for (let k = row + 1; k < n; k += 1) sum -= m[row]![k]! * x[k]!;
    x[row] = sum / m[row]![row]!;
  }
  return x;
}

/**
 * Refuses corner sets that cannot be the image of a rectangle: repeated points, three in a line,
 * or a crossed or concave outline.
 */
export function assertUsableCorners(corners: readonly Point[], minSeparationPx: number): void {
  for (let i = 0; i < 4; i += 1) {
    for (let j = i + 1; j < 4; j += 1) {
      const gap = distance(corners[i]!, corners[j]!);
      if (gap <= minSeparationPx) {
        throw new DomainError(
          `corners ${i + 1} and ${j + 1} of the calibration rectangle are only ${gap.toFixed(1)} px apart: pick the four corners of the rectangle`,
          ['calibration', 'corners', j],
        );
      }
    }
  }
  const turns = [0, 1, 2, 3].map((i) =>
    turn(corners[i]!, corners[(i + 1) % 4]!, corners[(i + 2) % 4]!),
  );
  const scale = Math.max(...corners.map((p) => Math.max(Math.abs(p[0]), Math.abs(p[1]))), 1);
  if (turns.some((t) => Math.abs(t) <= 1e-9 * scale * scale)) {
    throw new DomainError(
      'three corners of the calibration rectangle lie in a line: pick the four corners of the rectangle',
      ['calibration', 'corners'],
    );
  }
  if (!(turns.every((t) => t > 0) || turns.every((t) => t < 0))) {
    throw new DomainError(
      'the calibration corners cross or fold in: pick them in order around the rectangle, (0,0), (W,0), (W,H), (0,H)',
      ['calibration', 'corners'],
    );
  }
}

/**
 * The homography mapping the four image corners onto the rectangle (0,0), (W,0), (W,H), (0,H) in mm:
 * the direct linear transform with Hartley normalisation. With exactly four correspondences the
 * system is square once h33 is fixed at 1, which holds in normalised coordinates because the
 * centroid of a convex outline maps to a finite point inside the rectangle.
 */
export function rectangleHomography(
  corners: readonly Point[],
  widthMm: number,
  heightMm: number,
): Homography {
  const plane: Point[] = [
    [0, 0],
    [widthMm, 0],
    [widthMm, heightMm],
    [0, heightMm],
  ];
  const source = normalisation(corners);
  const target = normalisation(plane);
  const norm = (t: number[], [x, y]: Point): Point => [t[0]! * x + t[2]!, t[4]! * y + t[5]!];
  const rows: number[][] = [];
  const rhs: number[] = [];
  for (let i = 0; i < 4; i += 1) {
    const [x, y] = norm(source.t, corners[i]!);
    const [u, v] = norm(target.t, plane[i]!);
    rows.push([x, y, 1, 0, 0, 0, -u * x, -u * y]);
    rhs.push(u);
    rows.push([0, 0, 0, x, y, 1, -v * x, -v * y]);
    rhs.push(v);
  }
  const h = solve(rows, rhs);
  if (!h)
    throw new DomainError(
      'the calibration corners do not define a plane: pick the four corners of the rectangle',
      ['calibration', 'corners'],
    );
  const normalised = [...h, 1];
  const full = multiply(multiply(target.inverse, normalised), source.t);
  const scale = full[8]!;
  return full.map((value) => value / scale) as unknown as Homography;
}
