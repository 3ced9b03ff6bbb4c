import { describe, expect, it } from 'vitest';
import { comparisonWords, ruleName } from './verdict-words';

// Invented rules and values; the inch conversion is the exact 1 in = 25.4 mm of NIST SP 811, app. B.
const rule = {
  id: 'hpt1-ngv.crack.edges',
  title: 'Cracks at the vane edges',
  serviceableMax: 1,
  repeatMax: 1.5,
  notPermitted: false,
};

describe('what a verdict was compared with', () => {
  it('names the value, its uncertainty, the limit it stays within, the revision and the rule title', () => {
    expect(comparisonWords({ value: 1.32, uncertainty: 0.09, unit: 'mm' }, rule, 'D-1')).toBe(
      '1.32 mm + 0.09 uncertainty, within the repeat limit 1.50 mm (revision D-1, Cracks at the vane edges)',
    );
    expect(comparisonWords({ value: 0.8, uncertainty: 0.1, unit: 'mm' }, rule, 'D-1')).toBe(
      '0.80 mm + 0.10 uncertainty, within the serviceable limit 1.00 mm (revision D-1, Cracks at the vane edges)',
    );
  });

  it('names the highest limit passed when the value and its uncertainty pass them all', () => {
    expect(comparisonWords({ value: 1.45, uncertainty: 0.09, unit: 'mm' }, rule, 'D-1')).toBe(
      '1.45 mm + 0.09 uncertainty, over the repeat limit 1.50 mm (revision D-1, Cracks at the vane edges)',
    );
  });

  it('shows a rule written in inches in millimetres with its inches beside them', () => {
    const tip = { ...rule, title: 'Tip cracks', serviceableMax: 0.03, repeatMax: 0.06 };
    // 0.052 in = 1.3208 mm; 0.0035 in = 0.0889 mm; 0.060 in = 1.524 mm.
    expect(comparisonWords({ value: 0.052, uncertainty: 0.0035, unit: 'in' }, tip, 'D-1')).toBe(
      '1.32 mm (0.0520 in) + 0.09 uncertainty, within the repeat limit 1.52 mm (0.0600 in) (revision D-1, Tip cracks)',
    );
  });

  it('says so for a damage not permitted, nothing measured, and an untitled rule by its id', () => {
    expect(
      comparisonWords(
        { value: 0.2, uncertainty: 0, unit: 'mm' },
        { ...rule, notPermitted: true },
        'D-2',
      ),
    ).toBe('not permitted at all (revision D-2, Cracks at the vane edges)');
    expect(
      comparisonWords(
        { value: null, uncertainty: null, unit: 'mm2' },
        { ...rule, title: '' },
        'D-1',
      ),
    ).toBe('nothing measured to compare (revision D-1, hpt1-ngv.crack.edges)');
    expect(ruleName({ id: 'x.1', title: '' })).toBe('x.1');
  });
});
