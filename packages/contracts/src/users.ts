import { z } from 'zod';
import { emailSchema } from './auth';
import { roleSchema } from './roles';

export const userStatusSchema = z.enum(['active', 'invited', 'disabled']);
export type UserStatus = z.infer<typeof userStatusSchema>;

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
});
export type User = z.infer<typeof userSchema>;

export const userListResponseSchema = z.object({ items: z.array(userSchema) });
export type UserListResponse = z.infer<typeof userListResponseSchema>;

export const inviteUserInputSchema = z.strictObject({
  email: emailSchema,
  name: z.string().trim().min(1, { message: 'Enter the person’s name' }).max(120),
  role: roleSchema,
  organisationId: z.string().min(1, { message: 'Choose an organisation' }),
});
export type InviteUserInput = z.infer<typeof inviteUserInputSchema>;

export const updateUserInputSchema = z
  .strictObject({
    name: z.string().trim().min(1).max(120).optional(),
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
