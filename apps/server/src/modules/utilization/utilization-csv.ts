import {
  utilizationRecordInputSchema,
  type UtilizationRecordInput,
} from '@emberline/contracts/fleet';
import { readCsv } from '../../lib/csv';

export const CSV_COLUMNS = ['period_start', 'period_end', 'cycles', 'hours'] as const;

export interface CsvLine {
  line: number;
  text: string;
  record: UtilizationRecordInput | null;
  reason: string | null;
}

function toNumber(text: string): number {
  const trimmed = text.trim();
  return trimmed === '' ? Number.NaN : Number(trimmed);
}

/**
 * Reads a utilization CSV: a header naming period_start, period_end, cycles and hours (any order,
 * any case), then one period a line. A structural fault (not UTF-8, no header, a missing column)
 * refuses the whole file; a bad line is refused by itself, with its file line number and reason.
 */
export function parseUtilizationCsv(bytes: Buffer): CsvLine[] {
  return readCsv(bytes, CSV_COLUMNS).map(({ line, text, values, reason }): CsvLine => {
    if (!values) return { line, text, record: null, reason };
    const parsed = utilizationRecordInputSchema.safeParse({
      periodStart: values.period_start,
      periodEnd: values.period_end,
      cycles: toNumber(values.cycles ?? ''),
      hours: toNumber(values.hours ?? ''),
    });
    if (!parsed.success) {
      const issue = parsed.error.issues[0]!;
      const field =
        (
          {
            periodStart: 'period_start',
            periodEnd: 'period_end',
            cycles: 'cycles',
            hours: 'hours',
          } as Record<string, string>
        )[String(issue.path[0])] ?? 'the line';
      const message = issue.code === 'invalid_type' ? 'is not a number' : issue.message;
      return { line, text, record: null, reason: `${field} ${message}` };
    }
    return { line, text, record: parsed.data, reason: null };
  });
}
