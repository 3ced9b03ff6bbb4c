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
      'CSN 10,000 does not fit the utilization records, which give about 10,200 on 28 Feb 2026.',
    );
  });

  it('counts a straddling period in proportion', () => {
    // Mid-March: 16 of March’s 31 days are still to fly, about 52 cycles.
    expect(
      inspectionFlags({ ...base, date: '2026-03-15', csn: 10_248, tsn: 20_497 }, engine, records),
    ).toEqual([]);
  });

  it('after the last figures, raises a jump of more than twice the 90-day rate plus 10 cycles (20 hours)', () => {
    // The records give 300 cycles and 600 h over the 90 days to 31 March: 3.33 cycles and 6.67 h a
    // day. 31 days later the allowance is 2 × 3.33 × 31 + 10 = 216.7 cycles and 2 × 6.67 × 31 + 20
    // = 433.3 h.
    const at = (csn: number, tsn: number) =>
      inspectionFlags({ ...base, date: '2026-05-01', csn, tsn }, engine, records).map(
        (flag) => flag.code,
      );
    expect(at(10_300 + 216, 20_600 + 433)).toEqual([]);
    expect(at(10_300 + 218, 20_600 + 433)).toEqual(['csn-doubt']);
    expect(at(10_300 + 216, 20_600 + 435)).toEqual(['tsn-doubt']);
    // The jump that went through: 3,260 cycles in two days.
    const jump = inspectionFlags(
      { ...base, date: '2026-04-02', csn: 13_560, tsn: 20_610 },
      engine,
      records,
    );
    expect(jump.map((flag) => flag.code)).toEqual(['csn-doubt']);
    expect(jump[0]!.message).toBe(
      'CSN 13,560 is 3,260 cycles more than the 10,300 of 31 Mar 2026, 2 days earlier; the engine flies about 7 cycles in that time.',
    );
  });

  it('without utilization records, raises more than 20 cycles (40 hours) a day', () => {
    const at = (csn: number, tsn: number) =>
      inspectionFlags({ ...base, date: '2026-04-10', csn, tsn }, engine, []).map(
        (flag) => flag.code,
      );
    expect(at(10_300 + 200, 20_600 + 400)).toEqual([]);
    expect(at(10_300 + 201, 20_600 + 401)).toEqual(['csn-doubt', 'tsn-doubt']);
  });

  it('after the last figures, raises values below them', () => {
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
