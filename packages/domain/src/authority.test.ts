import { describe, expect, it } from 'vitest';
import { authorityToSign } from './authority';

// An invented authorisation.
const authorisation = { ref: 'AUTH-DEMO-7', models: ['model-a'], expiresOn: '2027-01-31' };

describe('authority to sign', () => {
  it('gives the reference of a current authorisation for the model, through its last day', () => {
    expect(authorityToSign(authorisation, 'model-a', '2026-12-03')).toEqual({ ref: 'AUTH-DEMO-7' });
    expect(authorityToSign(authorisation, 'model-a', '2027-01-31')).toEqual({ ref: 'AUTH-DEMO-7' });
  });

  it('refuses, saying why, without one, after it expired, or for another model', () => {
    expect(authorityToSign(null, 'model-a', '2026-12-03')).toEqual({
      refused: expect.stringMatching(/no authorisation/),
    });
    expect(authorityToSign(authorisation, 'model-a', '2027-02-01')).toEqual({
      refused: expect.stringMatching(/expired on 31 Jan 2027/),
    });
    expect(authorityToSign(authorisation, 'model-b', '2026-12-03')).toEqual({
      refused: expect.stringMatching(/does not cover this engine model/),
    });
  });
});
