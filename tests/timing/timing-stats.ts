/** The median of a list of timings. */
export function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length / 2;
  return sorted.length % 2
    ? sorted[Math.floor(middle)]!
    : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/**
 * The shift between two sets of timings (Hodges–Lehmann: the median of every a − b difference),
 * which resists the single slow answers a shared two-core machine gives either side.
 */
export function shift(a: number[], b: number[]): number {
  return median(a.flatMap((x) => b.map((y) => x - y)));
}
