import { z } from 'zod';
import { nameText } from './text';
import { roleSchema } from './roles';

const utf8 = new TextEncoder();

/** bcrypt reads at most 72 bytes; anything longer would be silently cut, so it is refused. */
export const PASSWORD_MAX_BYTES = 72;
export const PASSWORD_MIN_LENGTH = 12;

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: 'Enter an e-mail address such as name@example.com' }).max(254));

/** A password being checked at sign-in: only the byte limit, so a long paste gets a clear answer. */
const presentedPasswordSchema = z
  .string()
  .min(1, { message: 'Enter your password' })
  .refine((value) => utf8.encode(value).length <= PASSWORD_MAX_BYTES, {
    message: `Passwords are at most ${PASSWORD_MAX_BYTES} bytes long`,
  });

/** A password being chosen. */
export const newPasswordSchema = z
  .string()
  .min(PASSWORD_MIN_LENGTH, {
    message: `Choose a password of at least ${PASSWORD_MIN_LENGTH} characters`,
  })
  .refine((value) => utf8.encode(value).length <= PASSWORD_MAX_BYTES, {
    message: `Passwords are at most ${PASSWORD_MAX_BYTES} bytes long (fewer characters if you use accents or symbols)`,
  });

export const loginInputSchema = z.strictObject({
  email: emailSchema,
  password: presentedPasswordSchema,
});
export type LoginInput = z.infer<typeof loginInputSchema>;

export const sessionUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  organisationId: z.string(),
  organisationName: z.string(),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

export const meResponseSchema = z.object({ user: sessionUserSchema });
export type MeResponse = z.infer<typeof meResponseSchema>;

export const changePasswordInputSchema = z.strictObject({
  currentPassword: presentedPasswordSchema,
  newPassword: newPasswordSchema,
});
export type ChangePasswordInput = z.infer<typeof changePasswordInputSchema>;

export const passwordResetRequestSchema = z.strictObject({ email: emailSchema });
/** The same answer whether or not the address has an account. */
export const passwordResetAcceptedSchema = z.object({ status: z.literal('sent-if-known') });
export type PasswordResetRequest = z.infer<typeof passwordResetRequestSchema>;

/** Tokens are 32 random bytes in base64url: 43 characters. */
export const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/, {
  message: 'This link is not complete: open it again from the e-mail',
});

export const passwordResetConfirmSchema = z.strictObject({
  token: tokenSchema,
  password: newPasswordSchema,
});
export type PasswordResetConfirm = z.infer<typeof passwordResetConfirmSchema>;

export const acceptInvitationInputSchema = z.strictObject({
  token: tokenSchema,
  name: nameText('Enter your name'),
  password: newPasswordSchema,
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationInputSchema>;

export const invitationInfoSchema = z.object({
  email: z.string(),
  name: z.string(),
  organisationName: z.string(),
  role: roleSchema,
});
export type InvitationInfo = z.infer<typeof invitationInfoSchema>;
