export type Point = readonly [number, number];

/** Straight-line distance. Math.hypot is several times slower in V8, and image coordinates are far from overflow. */
export function distance(a: Point, b: Point): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  return Math.sqrt(dx * dx + dy * dy);
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
  if (points.length === 0) return 0;
  let twice = 0;
  let [x1, y1] = points[points.length - 1]!;
  for (const [x2, y2] of points) {
    twice += x1 * y2 - x2 * y1;
    x1 = x2;
    y1 = y2;
  }
  return Math.abs(twice) / 2;
}

/**
 * Largest vertex-to-vertex distance. The farthest pair lies on the convex hull, found by rotating
 * calipers round it: O(n log n) instead of comparing every pair, so a 2,000-point outline costs
 * well under a millisecond.
 */
export function maxExtent(points: readonly Point[]): number {
  const hull = convexHull(points);
  const count = hull.length;
  if (count < 2) return 0;
  if (count === 2) return distance(hull[0]!, hull[1]!);
  const squared = (a: Point, b: Point) => (b[0] - a[0]) ** 2 + (b[1] - a[1]) ** 2;
  const spread = (a: Point, b: Point, c: Point) => Math.abs(turn(a, b, c));
  let largest = 0;
  let far = 1;
  for (let index = 0; index < count; index += 1) {
    const from = hull[index]!;
    const to = hull[(index + 1) % count]!;
    while (spread(from, to, hull[(far + 1) % count]!) > spread(from, to, hull[far]!))
      far = (far + 1) % count;
    largest = Math.max(largest, squared(from, hull[far]!), squared(to, hull[far]!));
  }
  return Math.sqrt(largest);
}

/**
 * The convex hull, anticlockwise in a y-up frame, without points on its edges (Andrew's monotone
 * chain). Fewer than three distinct points come back as they are, without repeats.
 */
export function convexHull(points: readonly Point[]): Point[] {
  const sorted = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const unique = sorted.filter(
    (point, index) =>
      index === 0 || point[0] !== sorted[index - 1]![0] || point[1] !== sorted[index - 1]![1],
  );
  if (unique.length < 3) return unique;
  const chain = (ordered: readonly Point[]) => {
    const kept: Point[] = [];
    for (const point of ordered) {
      while (kept.length >= 2 && turn(kept[kept.length - 2]!, kept[kept.length - 1]!, point) <= 0)
        kept.pop();
      kept.push(point);
    }
    kept.pop();
    return kept;
  };
  return [...chain(unique), ...chain([...unique].reverse())];
}

/** The z of the cross product (b − a) × (c − b): its sign says which way the path turns at b. */
export function turn(a: Point, b: Point, c: Point): number {
  return (b[0] - a[0]) * (c[1] - b[1]) - (b[1] - a[1]) * (c[0] - b[0]);
}

export function formatPx(value: number): string {
  return value < 10 ? value.toFixed(1) : value.toFixed(0);
}
