import { z } from 'zod';

export const trendRequestSchema = z.strictObject({
  points: z
    .array(z.strictObject({ csn: z.number().finite().min(0), value: z.number().finite().min(0) }))
    .min(2, { message: 'a trend needs at least two inspections' })
    .max(1000),
  limit: z.number().finite().positive(),
});
export type TrendRequest = z.infer<typeof trendRequestSchema>;

export const trendResultSchema = z.object({
  n: z.number().int(),
  intercept: z.number(),
  slopePerCycle: z.number(),
  r2: z.number().nullable(),
  projectedCsnAtLimit: z.number().nullable(),
  cyclesRemaining: z.number().nullable(),
});
export type TrendResult = z.infer<typeof trendResultSchema>;
