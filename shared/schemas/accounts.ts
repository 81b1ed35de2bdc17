import { z } from 'zod';
import { roleSchema } from '../roles';

const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: 'enter an e-mail address' }).max(254, 'at most 254 characters'));

/** The same rule as `npm run create-keeper`. */
export const newPasswordSchema = z.string().min(10, 'use at least 10 characters').max(200, 'at most 200 characters');

/** A token from a mail link: 43 base64url characters (32 random bytes). */
export const mailTokenSchema = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9_-]{43}$/, 'this link is not complete; open it from the mail again');

export const invitationCreateSchema = z.object({ email: emailSchema, role: roleSchema });
export type InvitationCreate = z.infer<typeof invitationCreateSchema>;

/** A pending invitation as the Members panel lists it (Keepers only). */
export const invitationSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  role: roleSchema,
  invitedAt: z.string(),
  expiresAt: z.string(),
  /** Past its expiry: resend it to give a new link. */
  expired: z.boolean(),
});
export type Invitation = z.infer<typeof invitationSchema>;

export const tokenRequestSchema = z.object({ token: mailTokenSchema });

/** What the invitation page shows before accepting. */
export const invitationPreviewSchema = z.object({
  cellarId: z.uuid(),
  cellarName: z.string(),
  email: z.string(),
  role: roleSchema,
  expiresAt: z.string(),
  /** Whether an account uses the invited address (the holder of the mailed link may know). */
  accountExists: z.boolean(),
});
export type InvitationPreview = z.infer<typeof invitationPreviewSchema>;

export const invitationSignUpSchema = z.object({
  token: mailTokenSchema,
  displayName: z.string().trim().min(1, 'enter your name').max(80, 'at most 80 characters'),
  password: newPasswordSchema,
});
export type InvitationSignUp = z.infer<typeof invitationSignUpSchema>;

export const passwordResetRequestSchema = z.object({ email: emailSchema });

/** The one answer to a reset request, whether or not the address has an account. */
export const passwordResetAnswerSchema = z.object({ message: z.string() });

export const passwordResetCompleteSchema = z.object({ token: mailTokenSchema, password: newPasswordSchema });
export type PasswordResetComplete = z.infer<typeof passwordResetCompleteSchema>;
