import { z } from 'zod';

export const mailSummarySchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  attachments: z.number().int(),
});
export type MailSummary = z.infer<typeof mailSummarySchema>;

/** The caught messages, newest first; `catching` is false when a real relay is configured. */
export const mailListResponseSchema = z.object({
  items: z.array(mailSummarySchema),
  catching: z.boolean(),
});
export type MailListResponse = z.infer<typeof mailListResponseSchema>;

export const mailMessageSchema = mailSummarySchema.extend({
  text: z.string(),
  attachmentList: z.array(
    z.object({ filename: z.string(), contentType: z.string(), size: z.number().int() }),
  ),
});
export type MailMessage = z.infer<typeof mailMessageSchema>;
