import Papa from 'papaparse';
import {
  utilizationRecordInputSchema,
  type UtilizationRecordInput,
} from '@emberline/contracts/fleet';
import { AppError } from '../../http/app-error';

export const CSV_COLUMNS = ['period_start', 'period_end', 'cycles', 'hours'] as const;

export interface CsvLine {
  line: number;
  text: string;
  record: UtilizationRecordInput | null;
  reason: string | null;
}

function structural(message: string): AppError {
  return new AppError(422, 'unreadable_file', message);
}

/** Decodes the upload as UTF-8, refusing it whole when it is not (a spreadsheet's legacy export). */
function decode(bytes: Buffer): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes).replace(/^\uFEFF/, '');
  } catch {
    throw structural(
      'The file is not UTF-8 text. Save it from the spreadsheet as “CSV UTF-8” and try again; nothing was imported.',
    );
  }
}

function toNumber(text: string): number {
  const trimmed = text.trim();
  return trimmed === '' ? Number.NaN : Number(trimmed);
}

function cellsOf(line: string): { cells: string[]; broken: boolean } {
  const parsed = Papa.parse<string[]>(line, { header: false });
  return {
    cells: (parsed.data[0] ?? []).map((cell) => cell.trim()),
    broken: parsed.errors.some((error) => error.type === 'Quotes'),
  };
}

/**
 * Reads a utilization CSV: a header naming period_start, period_end, cycles and hours (any order,
 * any case), then one period a line. A structural fault (not UTF-8, no header, a missing column)
 * refuses the whole file; a bad line is refused by itself, with its file line number and reason.
 */
export function parseUtilizationCsv(bytes: Buffer): CsvLine[] {
  if (bytes.length === 0) throw structural('The file is empty; nothing was imported.');
  const lines = decode(bytes).split(/\r\n|\n|\r/);
  const headerIndex = lines.findIndex((line) => line.trim() !== '');
  if (headerIndex === -1) throw structural('The file is empty; nothing was imported.');
  const header = cellsOf(lines[headerIndex]!).cells.map((name) =>
    name.toLowerCase().replace(/\s+/g, '_'),
  );
  const missing = CSV_COLUMNS.filter((column) => !header.includes(column));
  if (missing.length > 0) {
    throw structural(
      `The file has no column ${missing.join(', ')}. Its first line must name the columns ${CSV_COLUMNS.join(', ')}; nothing was imported.`,
    );
  }
  const at = Object.fromEntries(
    CSV_COLUMNS.map((column) => [column, header.indexOf(column)]),
  ) as Record<(typeof CSV_COLUMNS)[number], number>;
  const result: CsvLine[] = [];
  lines.forEach((text, index) => {
    if (index <= headerIndex || text.trim() === '') return;
    const line = index + 1;
    const { cells, broken } = cellsOf(text);
    if (broken)
      return result.push({
        line,
        text,
        record: null,
        reason: 'the line has a quotation mark that is never closed',
      });
    if (cells.length !== header.length) {
      return result.push({
        line,
        text,
        record: null,
        reason: `the line has ${cells.length} values where the header names ${header.length} columns`,
      });
    }
    const parsed = utilizationRecordInputSchema.safeParse({
      periodStart: cells[at.period_start],
      periodEnd: cells[at.period_end],
      cycles: toNumber(cells[at.cycles] ?? ''),
      hours: toNumber(cells[at.hours] ?? ''),
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
      return result.push({ line, text, record: null, reason: `${field} ${message}` });
    }
    result.push({ line, text, record: parsed.data, reason: null });
  });
  return result;
}
