import { z } from 'zod';
import { daysInOrder, findingSearchFilters } from './fleet-findings';

/** Findings as CSV or XLSX (one row a recorded finding, units in the headers). */
export const tableFormats = ['csv', 'xlsx'] as const;
/** An inspection also exports whole, as JSON in the contract shapes. */
export const exportFormats = [...tableFormats, 'json'] as const;
export type ExportFormat = (typeof exportFormats)[number];

export const exportFormatLabels: Record<ExportFormat, string> = {
  csv: 'CSV',
  xlsx: 'Excel (XLSX)',
  json: 'JSON (whole inspection)',
};

export const inspectionExportQuerySchema = z.strictObject({
  format: z.enum(exportFormats, { message: 'Choose csv, xlsx or json' }),
});

export const engineExportQuerySchema = z.strictObject({
  format: z.enum(tableFormats, { message: 'Choose csv or xlsx' }),
});

/** The fleet's findings, narrowed like the fleet list; customers get their own whatever is asked. */
/** The fleet's findings as a file: what the fleet findings search selects, in its order. */
export const fleetExportQuerySchema = z
  .strictObject({
    format: z.enum(tableFormats, { message: 'Choose csv or xlsx' }),
    ...findingSearchFilters,
  })
  .refine(daysInOrder, { message: 'The first day comes after the last', path: ['to'] });
export type FleetExportQuery = z.output<typeof fleetExportQuerySchema>;
