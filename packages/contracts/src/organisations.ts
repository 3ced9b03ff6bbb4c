import { z } from 'zod';
import { pageOf, pageQuerySchema } from './paging';
import { nameText } from './text';
import { emailSchema } from './auth';

export const organisationKindSchema = z.enum(['home', 'customer']);
export type OrganisationKind = z.infer<typeof organisationKindSchema>;

export const organisationSchema = z.object({
  id: z.string(),
  name: z.string(),
  kind: organisationKindSchema,
});
export type Organisation = z.infer<typeof organisationSchema>;

export const organisationListQuerySchema = pageQuerySchema;
export const organisationListResponseSchema = pageOf(organisationSchema);
export type OrganisationListResponse = z.infer<typeof organisationListResponseSchema>;

export const organisationInputSchema = z.strictObject({
  name: nameText('Enter the organisation’s name', { min: 2 }),
});
export type OrganisationInput = z.infer<typeof organisationInputSchema>;

export const contactInputSchema = z.strictObject({
  name: nameText('Enter the contact’s name'),
  email: emailSchema,
  role: nameText('Say what they do, such as technical records', { max: 80 }),
  /** Gets each released inspection's signed report by e-mail. */
  receivesReports: z.boolean().default(true),
  /** Gets the urgent notices: an outcome ordering removal before the next flight. */
  receivesUrgent: z.boolean().default(true),
});
export type ContactInput = z.input<typeof contactInputSchema>;
export type ParsedContactInput = z.output<typeof contactInputSchema>;

export const contactSchema = contactInputSchema.extend({ id: z.string(), createdAt: z.string() });
export type Contact = z.infer<typeof contactSchema>;

export const organisationDetailSchema = organisationSchema.extend({
  contacts: z.array(contactSchema),
  engineCount: z.number().int(),
});
export type OrganisationDetail = z.infer<typeof organisationDetailSchema>;
