import { describe, expect, it } from 'vitest';
import { inspectionFlags } from './inspection-flags';

const engine = { csn: 10_300, tsn: 20_600, tsnCsnAsOf: '2026-03-31' };
const records = [
  { periodStart: '2026-01-01', periodEnd: '2026-01-31', cycles: 100, hours: 200 },
  { periodStart: '2026-02-01', periodEnd: '2026-02-28', cycles: 100, hours: 200 },
  { periodStart: '2026-03-01', periodEnd: '2026-03-31', cycles: 100, hours: 200 },
];
const base = {
  date: '2026-02-28',
  csn: 10_200,
  tsn: 20_400,
  qualificationExpiresOn: '2027-01-01',
  probeCalibrationDueOn: '2026-06-30',
};

describe('inspection flags', () => {
  it('raises nothing for figures that fit the records and valid certificates', () => {
    // At the end of February the engine had its 31 March figures less March: 10,200 cycles, 20,400 h.
    expect(inspectionFlags(base, engine, records)).toEqual([]);
  });

  it('raises an expired probe calibration and an expired qualification', () => {
    const flags = inspectionFlags(
      { ...base, probeCalibrationDueOn: '2026-02-27', qualificationExpiresOn: '2026-01-15' },
      engine,
      records,
    );
    expect(flags.map((flag) => flag.code)).toEqual([
      'probe-calibration-expired',
      'qualification-expired',
    ]);
  });

  it('raises CSN and TSN that do not fit the utilization history', () => {
    const flags = inspectionFlags({ ...base, csn: 10_000, tsn: 21_000 }, engine, records);
    expect(flags.map((flag) => flag.code)).toEqual(['csn-doubt', 'tsn-doubt']);
    expect(flags[0]!.message).toBe(
      'CSN 10,000 does not fit the utilization records, which give about 10,200 on 2026-02-28.',
    );
  });

  it('counts a straddling period in proportion', () => {
    // Mid-March: 16 of March’s 31 days are still to fly, about 52 cycles.
    expect(
      inspectionFlags({ ...base, date: '2026-03-15', csn: 10_248, tsn: 20_497 }, engine, records),
    ).toEqual([]);
  });

  it('after the last figures, raises only values below them', () => {
    expect(
      inspectionFlags({ ...base, date: '2026-05-01', csn: 10_400, tsn: 20_800 }, engine, records),
    ).toEqual([]);
    expect(
      inspectionFlags(
        { ...base, date: '2026-05-01', csn: 10_250, tsn: 20_800 },
        engine,
        records,
      )[0]!.code,
    ).toBe('csn-doubt');
  });
});
