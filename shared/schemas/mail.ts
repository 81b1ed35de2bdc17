import { z } from 'zod';

export const MAIL_KINDS = ['invitation', 'password-reset', 'task-reminder', 'task-digest'] as const;
export const mailKindSchema = z.enum(MAIL_KINDS);

/** A message of this cellar that has not reached the SMTP server yet, or never will without help. */
export const undeliveredMailSchema = z.object({
  id: z.uuid(),
  kind: mailKindSchema,
  to: z.string(),
  subject: z.string(),
  /** 'pending': still being retried; 'failed': gave up, a Keeper may retry. */
  status: z.enum(['pending', 'failed']),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  nextAttemptAt: z.string(),
  createdAt: z.string(),
});
export type UndeliveredMail = z.infer<typeof undeliveredMailSchema>;

/** What a Keeper sees of the cellar's mail: the mode, and what is stuck. */
export const mailStatusSchema = z.object({
  /** True when no SMTP is configured and every mail goes to the app's own local mailbox. */
  localMailbox: z.boolean(),
  undelivered: z.array(undeliveredMailSchema),
});
export type MailStatus = z.infer<typeof mailStatusSchema>;

/** A message the local mailbox received. */
export const receivedMailSchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string(),
  /** 'account': mail to one person not tied to a cellar (password reset). */
  scope: z.enum(['cellar', 'account']),
});
export type ReceivedMailView = z.infer<typeof receivedMailSchema>;
