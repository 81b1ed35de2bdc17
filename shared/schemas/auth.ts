import { z } from 'zod';
import { roleSchema } from '../roles';

export const signInRequestSchema = z.object({
  email: z
    .string()
    // NFKC first: full-width or compatibility letters become the plain ones a person meant.
    .transform((text) => text.normalize('NFKC').trim().toLowerCase())
    .pipe(z.email({ message: 'enter an e-mail address' })),
  password: z.string().min(1, 'enter your password').max(200, 'password is too long'),
});
export type SignInRequest = z.infer<typeof signInRequestSchema>;

export const cellarMembershipSchema = z.object({
  cellarId: z.uuid(),
  cellarName: z.string(),
  role: roleSchema,
});
export type CellarMembership = z.infer<typeof cellarMembershipSchema>;

/** The signed-in user as the client sees it: never a password or its hash. */
export const sessionUserSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  displayName: z.string(),
  cellars: z.array(cellarMembershipSchema),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;
