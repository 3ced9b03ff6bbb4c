import { describe, expect, it } from 'vitest';
import { fromMillimetres, MM2_PER_SQUARE_INCH, MM_PER_INCH } from '../../packages/domain/src/units';

describe('unit conversions', () => {
  it('uses 1 in = 25.4 mm exactly (NIST SP 811, appendix B.9; US 16 CFR 500.19)', () => {
    expect(MM_PER_INCH).toBe(25.4);
    expect(fromMillimetres(25.4, 'in')).toBe(1);
  });

  it('uses 1 in² = 645.16 mm² exactly (NIST SP 811, appendix B.9: 6.4516 E−04 m²)', () => {
    expect(MM2_PER_SQUARE_INCH).toBe(645.16);
    expect(fromMillimetres(645.16, 'in2')).toBe(1);
  });
});
