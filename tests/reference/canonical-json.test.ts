import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson, canonicalSha256 } from '../../apps/server/src/lib/canonical';

describe('canonical JSON of signed and published content (RFC 8785)', () => {
  it('gives the output of the worked example of RFC 8785 §3.2.3', () => {
    // RFC 8785, "JSON Canonicalization Scheme", section 3.2.3 (sorting and number serialisation).
    const input = JSON.parse(
      '{"numbers":[333333333.33333329,1E30,4.50,2e-3,0.000000000000000000000000001],' +
        '"string":"\\u20ac$\\u000F\\u000aA\'\\u0042\\u0022\\u005c\\\\\\"\\/",' +
        '"literals":[null,true,false]}',
    );
    expect(canonicalJson(input)).toBe(
      '{"literals":[null,true,false],"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27],' +
        '"string":"€$\\u000f\\nA\'B\\"\\\\\\\\\\"/"}',
    );
  });

  it('orders keys by UTF-16 code units, as RFC 8785 §3.2.3 requires', () => {
    // The RFC's own sorting example: keys that differ only beyond the Basic Multilingual Plane.
    const input = {
      '\u20ac': 'Euro Sign',
      '\r': 'Carriage Return',
      '\ud83d\ude00': 'Emoji: Grinning Face',
      '1': 'One',
      '\u0080': 'Control',
      '\u00f6': 'Latin Small Letter O With Diaeresis',
      '\ufb33': 'Hebrew Letter Dalet With Dagesh',
    };
    expect(canonicalJson(input)).toBe(
      '{"\\r":"Carriage Return","1":"One","\u0080":"Control","ö":"Latin Small Letter O With Diaeresis","€":"Euro Sign","\ud83d\ude00":"Emoji: Grinning Face","דּ":"Hebrew Letter Dalet With Dagesh"}',
    );
  });

  it('hashes the canonical text with SHA-256 (node:crypto as the reference digest)', () => {
    const value = { b: [1, 2], a: 'x' };
    expect(canonicalSha256(value)).toBe(
      createHash('sha256').update('{"a":"x","b":[1,2]}').digest('hex'),
    );
    expect(canonicalSha256({ a: 'x', b: [1, 2] })).toBe(canonicalSha256(value));
  });
});
