import { z } from 'zod';
import { intervalSchema } from './limits';

/** A calendar date `YYYY-MM-DD` (UTC) that exists. */
export const isoDateSchema = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, { message: 'use a date such as 2026-03-14 (YYYY-MM-DD)' })
  .refine(
    (value) => {
      const date = new Date(`${value}T00:00:00Z`);
      return !Number.isNaN(date.getTime()) && date.toISOString().slice(0, 10) === value;
    },
    { message: 'this date does not exist' },
  )
  // A day outside these years is a typing slip in this trade (and past what the day arithmetic
  // is tested for).
  .refine((value) => value >= '1900-01-01' && value <= '2200-12-31', {
    message: 'give a day between 1900 and 2200',
  });
export type IsoDate = z.infer<typeof isoDateSchema>;

export const forecastRequestSchema = z.strictObject({
  from: z.strictObject({
    date: isoDateSchema,
    csn: z.number().finite().min(0),
    tsn: z.number().finite().min(0),
  }),
  interval: intervalSchema,
  utilization: z.strictObject({
    cyclesPerDay: z.number().finite().min(0).nullable(),
    hoursPerDay: z.number().finite().min(0).max(24, { message: 'a day has 24 hours' }).nullable(),
  }),
});
export type ForecastRequest = z.infer<typeof forecastRequestSchema>;

export const forecastDimensionSchema = z.enum(['cycles', 'hours', 'days']);
export type ForecastDimension = z.infer<typeof forecastDimensionSchema>;

export const forecastResultSchema = z.object({
  dueCsn: z.number().nullable(),
  dueTsn: z.number().nullable(),
  dueDate: z.string().nullable(),
  governing: forecastDimensionSchema.nullable(),
  candidates: z.object({
    cycles: z.string().nullable(),
    hours: z.string().nullable(),
    days: z.string().nullable(),
  }),
});
export type ForecastResult = z.infer<typeof forecastResultSchema>;
