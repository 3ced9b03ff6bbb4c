import { describe, expect, it } from 'vitest';
import { canonicalJson, canonicalSha256, sha256Hex } from '../../apps/server/src/lib/canonical';

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

  it('computes SHA-256 as the published test vectors give it', () => {
    // FIPS 180-2, Appendix B.1 (one-block message "abc") and B.2 (two-block message).
    expect(sha256Hex('abc')).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
    expect(sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe(
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    );
  });

  it('hashes exactly the canonical text, whatever the order of the keys given', () => {
    const value = { b: [1, 2], a: 'x' };
    expect(canonicalSha256(value)).toBe(sha256Hex('{"a":"x","b":[1,2]}'));
    expect(canonicalSha256({ a: 'x', b: [1, 2] })).toBe(canonicalSha256(value));
  });
});
