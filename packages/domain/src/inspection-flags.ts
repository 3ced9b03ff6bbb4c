import { dayWords, daysBetween } from './dates';
import { dailyUtilization, type UtilizationIncrement } from './utilization';

export interface FlagInput {
  date: string;
  csn: number;
  tsn: number;
  qualificationExpiresOn: string;
  probeCalibrationDueOn: string;
}

export interface EngineTimes {
  csn: number;
  tsn: number;
  tsnCsnAsOf: string;
}

export interface RaisedFlag {
  code: 'probe-calibration-expired' | 'qualification-expired' | 'csn-doubt' | 'tsn-doubt';
  message: string;
}

/** Cycles and hours of the increments after `date`, a straddling period in proportion. */
function flownAfter(
  records: readonly UtilizationIncrement[],
  date: string,
): { cycles: number; hours: number } {
  let cycles = 0;
  let hours = 0;
  for (const record of records) {
    if (record.periodEnd <= date) continue;
    const days = daysBetween(record.periodStart, record.periodEnd) + 1;
    const after = record.periodStart > date ? days : daysBetween(date, record.periodEnd);
    cycles += (record.cycles * after) / days;
    hours += (record.hours * after) / days;
  }
  return { cycles, hours };
}

const round = (value: number) => Math.round(value).toLocaleString('en-GB');

/**
 * What to question about an inspection before it goes for review: an expired probe calibration or
 * inspector qualification on the day, and CSN or TSN that do not fit the engine's records. The
 * records give the engine's CSN and TSN on the day as its figures "as of" less what was flown
 * since; a difference of more than 1 % (and at least 10 cycles or hours) is raised. For a day after
 * the last figures, a value below them is raised, and so is one that grew by more than twice what
 * the 90-day rate gives over the days since, plus 10 cycles (20 hours); without utilization
 * records, by more than 20 cycles (40 hours) a day.
 */
export function inspectionFlags(
  input: FlagInput,
  engine: EngineTimes,
  records: readonly UtilizationIncrement[],
): RaisedFlag[] {
  const flags: RaisedFlag[] = [];
  if (input.probeCalibrationDueOn < input.date) {
    flags.push({
      code: 'probe-calibration-expired',
      message: `The probe’s calibration was due on ${dayWords(input.probeCalibrationDueOn)}, before the inspection on ${dayWords(input.date)}.`,
    });
  }
  if (input.qualificationExpiresOn < input.date) {
    flags.push({
      code: 'qualification-expired',
      message: `The inspector’s qualification expired on ${dayWords(input.qualificationExpiresOn)}, before the inspection on ${dayWords(input.date)}.`,
    });
  }
  const rates = dailyUtilization(records);
  const check = (
    code: 'csn-doubt' | 'tsn-doubt',
    label: string,
    given: number,
    asOf: number,
    flown: number,
  ) => {
    const cycles = code === 'csn-doubt';
    const unit = cycles ? 'cycles' : 'hours';
    if (input.date > engine.tsnCsnAsOf) {
      if (given < asOf) {
        flags.push({
          code,
          message: `${label} ${round(given)} is below the ${round(asOf)} the engine already had on ${dayWords(engine.tsnCsnAsOf)}.`,
        });
        return;
      }
      const days = daysBetween(engine.tsnCsnAsOf, input.date);
      const perDay = cycles ? rates.cyclesPerDay : rates.hoursPerDay;
      const allowance =
        perDay !== null ? 2 * perDay * days + (cycles ? 10 : 20) : (cycles ? 20 : 40) * days;
      if (given - asOf > allowance)
        flags.push({
          code,
          message:
            perDay !== null
              ? `${label} ${round(given)} is ${round(given - asOf)} ${unit} more than the ${round(asOf)} of ${dayWords(engine.tsnCsnAsOf)}, ${days} ${days === 1 ? 'day' : 'days'} earlier; the engine flies about ${round(perDay * days)} ${unit} in that time.`
              : `${label} ${round(given)} is ${round(given - asOf)} ${unit} more than the ${round(asOf)} of ${dayWords(engine.tsnCsnAsOf)}, ${days} ${days === 1 ? 'day' : 'days'} earlier: more than ${cycles ? 20 : 40} ${unit} a day, and no utilization is recorded.`,
        });
      return;
    }
    const expected = asOf - flown;
    if (Math.abs(given - expected) > Math.max(10, 0.01 * expected)) {
      flags.push({
        code,
        message: `${label} ${round(given)} does not fit the utilization records, which give about ${round(expected)} on ${dayWords(input.date)}.`,
      });
    }
  };
  const after = flownAfter(records, input.date);
  check('csn-doubt', 'CSN', input.csn, engine.csn, after.cycles);
  check('tsn-doubt', 'TSN', input.tsn, engine.tsn, after.hours);
  return flags;
}
