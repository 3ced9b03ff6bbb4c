/**
 * Whether a parsed JSON value nests no deeper than `limit` arrays and objects. Walked without
 * recursion: a value nested 100,000 deep (which JSON.parse takes) is answered, not a stack overflow
 * later in JSON.stringify.
 */
export function nestsWithin(value: unknown, limit: number): boolean {
  const stack: [unknown, number][] = [[value, 0]];
  while (stack.length > 0) {
    const [current, depth] = stack.pop()!;
    if (current === null || typeof current !== 'object') continue;
    if (depth >= limit) return false;
    for (const child of Array.isArray(current) ? current : Object.values(current))
      if (child !== null && typeof child === 'object') stack.push([child, depth + 1]);
  }
  return true;
}

/** How deep the product's own JSON goes (a rule's interval inside a rule inside a file is 4). */
export const MAX_JSON_DEPTH = 32;
