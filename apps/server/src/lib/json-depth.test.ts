import { describe, expect, it } from 'vitest';
import { MAX_JSON_DEPTH, nestsWithin } from './json-depth';

const nested = (depth: number) => JSON.parse(`${'['.repeat(depth)}1${']'.repeat(depth)}`);

describe('JSON nesting depth', () => {
  it('counts arrays and objects, and answers for values far deeper than the stack allows', () => {
    expect(nestsWithin(1, 0)).toBe(true);
    expect(nestsWithin({ a: [1, { b: 2 }] }, 3)).toBe(true);
    expect(nestsWithin({ a: [1, { b: 2 }] }, 2)).toBe(false);
    expect(nestsWithin(nested(MAX_JSON_DEPTH), MAX_JSON_DEPTH)).toBe(true);
    expect(nestsWithin(nested(MAX_JSON_DEPTH + 1), MAX_JSON_DEPTH)).toBe(false);
    // JSON.stringify of this throws RangeError (V8's recursion); the walk does not.
    const deep = nested(200_000);
    expect(() => JSON.stringify(deep)).toThrow(RangeError);
    expect(nestsWithin(deep, MAX_JSON_DEPTH)).toBe(false);
  });
});
