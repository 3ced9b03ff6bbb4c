import Papa from 'papaparse';
import { AppError } from '../http/app-error';

/** A fault of the file as a whole: nothing in it is taken. */
export function unreadableFile(message: string): AppError {
  return new AppError(422, 'unreadable_file', message);
}

/** Decodes an upload as UTF-8, refusing it whole when it is not (a spreadsheet's legacy export). */
export function decodeUtf8(bytes: Buffer, what = 'CSV UTF-8'): string {
  if (bytes.length === 0) throw unreadableFile('The file is empty; nothing was imported.');
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes).replace(/^\uFEFF/, '');
  } catch {
    throw unreadableFile(
      `The file is not UTF-8 text. Save it as “${what}” and try again; nothing was imported.`,
    );
  }
}

function cellsOf(line: string): { cells: string[]; broken: boolean } {
  const parsed = Papa.parse<string[]>(line, { header: false });
  return {
    cells: (parsed.data[0] ?? []).map((cell) => cell.trim()),
    broken: parsed.errors.some((error) => error.type === 'Quotes'),
  };
}

export interface CsvRow {
  /** The line number in the file, from 1. */
  line: number;
  text: string;
  /** The line's values by column name (lower case), or null with the reason it cannot be read. */
  values: Record<string, string> | null;
  reason: string | null;
}

/**
 * Reads a CSV file with a header: the first non-empty line names the columns (any order, any
 * case, spaces as underscores), and each further non-empty line is one record. A structural fault
 * (not UTF-8, no header, a required column missing) refuses the whole file; a line that cannot be
 * split into the header's columns is refused by itself.
 */
export function readCsv(bytes: Buffer, required: readonly string[]): CsvRow[] {
  const lines = decodeUtf8(bytes).split(/\r\n|\n|\r/);
  const headerIndex = lines.findIndex((line) => line.trim() !== '');
  if (headerIndex === -1) throw unreadableFile('The file is empty; nothing was imported.');
  const header = cellsOf(lines[headerIndex]!).cells.map((name) =>
    name.toLowerCase().replace(/\s+/g, '_'),
  );
  const missing = required.filter((column) => !header.includes(column));
  if (missing.length > 0) {
    throw unreadableFile(
      `The file has no column ${missing.join(', ')}. Its first line must name the columns ${required.join(', ')}; nothing was imported.`,
    );
  }
  const rows: CsvRow[] = [];
  lines.forEach((text, index) => {
    if (index <= headerIndex || text.trim() === '') return;
    const line = index + 1;
    const { cells, broken } = cellsOf(text);
    if (broken)
      return rows.push({
        line,
        text,
        values: null,
        reason: 'the line has a quotation mark that is never closed',
      });
    if (cells.length !== header.length)
      return rows.push({
        line,
        text,
        values: null,
        reason: `the line has ${cells.length} values where the header names ${header.length} columns`,
      });
    rows.push({
      line,
      text,
      values: Object.fromEntries(header.map((name, at) => [name, cells[at]!])),
      reason: null,
    });
  });
  return rows;
}

/** A cell of a written table: text, a number, or nothing. */
export type TableCell = string | number | null;

/**
 * Text a spreadsheet would take for a formula (it begins with =, +, -, @, a tab or a carriage
 * return) gets a leading apostrophe, so that a value someone typed is never run when the file is
 * opened (OWASP, "CSV Injection"). Numbers are left as they are.
 */
export function escapeFormula(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/**
 * A CSV file (RFC 4180 quoting, CRLF line ends) from a header and its rows, text escaped against
 * formula injection.
 */
export function writeCsv(
  header: readonly string[],
  rows: readonly (readonly TableCell[])[],
): string {
  return Papa.unparse(
    {
      fields: [...header],
      data: rows.map((row) =>
        row.map((cell) => (typeof cell === 'string' ? escapeFormula(cell) : (cell ?? ''))),
      ),
    },
    { newline: '\r\n' },
  );
}
