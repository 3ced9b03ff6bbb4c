import { z } from 'zod';

/** The one error shape of every Emberline API response with status 4xx or 5xx. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    requestId: z.string().optional(),
    details: z.unknown().optional(),
  }),
});
export type ApiError = z.infer<typeof apiErrorSchema>;

/** Field-level problems, as the server reports them in `details` of a 400 or 422. */
export const fieldErrorsSchema = z.object({
  fields: z.record(z.string(), z.array(z.string())),
  form: z.array(z.string()),
});
export type FieldErrors = z.infer<typeof fieldErrorsSchema>;
