import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { escapeFormula, writeCsv } from './csv';

// Reference (QUALITY §1): OWASP, "CSV Injection" — cells beginning with =, +, -, @, a tab or a
// carriage return are taken for formulas by spreadsheets; a leading apostrophe makes them text.
describe('formula injection in written tables', () => {
  it('escapes text beginning with each character a spreadsheet reads as a formula', () => {
    for (const start of ['=', '+', '-', '@', '\t', '\r'])
      expect(escapeFormula(`${start}1+1`)).toBe(`'${start}1+1`);
    for (const safe of ['1+1', 'crack = 2 mm', '', "'quoted", 'HPT stage 1'])
      expect(escapeFormula(safe)).toBe(safe);
  });

  it('leaves numbers as numbers, negative ones included, and quotes as RFC 4180 says', () => {
    const text = writeCsv(['a', 'b', 'c'], [[-1.5, '=cmd', 'say "hi", twice']]);
    const parsed = Papa.parse<string[]>(text, { header: false });
    expect(parsed.data[1]).toEqual(['-1.5', "'=cmd", 'say "hi", twice']);
    expect(text.split('\r\n')).toHaveLength(2);
  });
});
