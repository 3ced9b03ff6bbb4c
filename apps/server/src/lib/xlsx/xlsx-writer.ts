import ExcelJS from 'exceljs';
import { escapeFormula, type TableCell } from '../csv';

/**
 * A workbook of one sheet (exceljs): a bold, frozen header row and the rows below it, numbers as
 * numbers. Text that a spreadsheet could take for a formula is escaped as in CSV files.
 */
export async function writeXlsx(
  sheetName: string,
  header: readonly string[],
  rows: readonly (readonly TableCell[])[],
): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  workbook.creator = 'Emberline';
  const sheet = workbook.addWorksheet(sheetName.slice(0, 31), {
    views: [{ state: 'frozen', ySplit: 1 }],
  });
  sheet.addRow([...header]).font = { bold: true };
  for (const row of rows)
    sheet.addRow(row.map((cell) => (typeof cell === 'string' ? escapeFormula(cell) : cell)));
  sheet.columns.forEach((column, index) => {
    column.width = Math.min(48, Math.max(10, header[index]!.length + 2));
  });
  return Buffer.from(await workbook.xlsx.writeBuffer());
}
