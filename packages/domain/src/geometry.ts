export type Point = readonly [number, number];

export function distance(a: Point, b: Point): number {
  return Math.hypot(b[0] - a[0], b[1] - a[1]);
}

/** Sum of the segment lengths of an open polyline. */
export function polylineLength(points: readonly Point[]): number {
  let total = 0;
  for (let index = 1; index < points.length; index += 1)
    total += distance(points[index - 1]!, points[index]!);
  return total;
}

/** Perimeter of a closed polygon. */
export function polygonPerimeter(points: readonly Point[]): number {
  return polylineLength(points) + distance(points[points.length - 1]!, points[0]!);
}

/** Absolute shoelace area of a polygon. */
export function polygonArea(points: readonly Point[]): number {
  let twice = 0;
  for (let index = 0; index < points.length; index += 1) {
    const [x1, y1] = points[index]!;
    const [x2, y2] = points[(index + 1) % points.length]!;
    twice += x1 * y2 - x2 * y1;
  }
  return Math.abs(twice) / 2;
}

/** Largest vertex-to-vertex distance. */
export function maxExtent(points: readonly Point[]): number {
  let largest = 0;
  for (let i = 0; i < points.length; i += 1) {
    for (let j = i + 1; j < points.length; j += 1)
      largest = Math.max(largest, distance(points[i]!, points[j]!));
  }
  return largest;
}

/** The z of the cross product (b − a) × (c − b): its sign says which way the path turns at b. */
export function turn(a: Point, b: Point, c: Point): number {
  return (b[0] - a[0]) * (c[1] - b[1]) - (b[1] - a[1]) * (c[0] - b[0]);
}

export function formatPx(value: number): string {
  return value < 10 ? value.toFixed(1) : value.toFixed(0);
}
