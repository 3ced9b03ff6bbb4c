import { z } from 'zod';

export const organisationKindSchema = z.enum(['home', 'customer']);
export type OrganisationKind = z.infer<typeof organisationKindSchema>;

export const organisationSchema = z.object({
  id: z.string(),
  name: z.string(),
  kind: organisationKindSchema,
});
export type Organisation = z.infer<typeof organisationSchema>;

export const organisationListResponseSchema = z.object({ items: z.array(organisationSchema) });
export type OrganisationListResponse = z.infer<typeof organisationListResponseSchema>;
