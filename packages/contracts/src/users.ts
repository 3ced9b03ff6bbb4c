import { z } from 'zod';
import { pageOf, pageQuerySchema } from './paging';
import { nameText } from './text';
import { emailSchema } from './auth';
import { isoDateSchema } from './forecast';
import { roleSchema } from './roles';

export const userStatusSchema = z.enum(['active', 'invited', 'disabled']);
export type UserStatus = z.infer<typeof userStatusSchema>;

const referenceSchema = nameText('Give the reference', { max: 100 });

/**
 * An engineer's authority to sign dispositions (DESIGN §5.5): the reference of the authorisation,
 * the engine models it covers and the day it expires. Set by an administrator other than its holder.
 */
export const authorisationSchema = z.strictObject({
  ref: referenceSchema,
  models: z
    .array(z.string().min(1).max(64))
    .min(1, { message: 'Name at least one engine model' })
    .max(50),
  expiresOn: isoDateSchema,
});
export type Authorisation = z.infer<typeof authorisationSchema>;

/** An inspector's qualification (the reference of the borescope certificate and its expiry). */
export const qualificationSchema = z.strictObject({
  ref: referenceSchema,
  expiresOn: isoDateSchema,
});
export type Qualification = z.infer<typeof qualificationSchema>;

export const credentialsInputSchema = z.strictObject({
  authorisation: authorisationSchema.nullable(),
  qualification: qualificationSchema.nullable(),
});
export type CredentialsInput = z.infer<typeof credentialsInputSchema>;

/** A user as the API shows it: never a password hash. */
export const userSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  organisationId: z.string(),
  organisationName: z.string(),
  status: userStatusSchema,
  activeSessions: z.number().int(),
  lastSignInAt: z.string().nullable(),
  createdAt: z.string(),
  authorisation: authorisationSchema.nullable(),
  qualification: qualificationSchema.nullable(),
});
export type User = z.infer<typeof userSchema>;

export const userListQuerySchema = pageQuerySchema;
export const userListResponseSchema = pageOf(userSchema);
export type UserListResponse = z.infer<typeof userListResponseSchema>;

export const inviteUserInputSchema = z.strictObject({
  email: emailSchema,
  name: nameText('Enter the person’s name'),
  role: roleSchema,
  organisationId: z.string().min(1, { message: 'Choose an organisation' }),
});
export type InviteUserInput = z.infer<typeof inviteUserInputSchema>;

export const updateUserInputSchema = z
  .strictObject({
    name: nameText('Enter the person’s name').optional(),
    role: roleSchema.optional(),
    organisationId: z.string().min(1).optional(),
    disabled: z.boolean().optional(),
  })
  .refine((value) => Object.keys(value).length > 0, { message: 'Nothing to change' });
export type UpdateUserInput = z.infer<typeof updateUserInputSchema>;

export const idParamsSchema = z.strictObject({ id: z.string().min(1).max(64) });

export const inviteUserResponseSchema = z.object({
  user: userSchema,
  /** The invitation e-mail in the outbox: queued now, delivered by the worker. */
  mailId: z.string(),
});
export type InviteUserResponse = z.infer<typeof inviteUserResponseSchema>;
