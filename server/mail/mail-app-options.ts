import { DEFAULT_MAIL_RATE_LIMITS, type MailRateLimits } from '../accounts/mail-rate-limits';
import type { LocalMailbox } from './local-mailbox';

/** What the app factory needs to know about mail (server/app.ts `mail` option). */
export interface MailAppOptions {
  /** The local mailbox, when no SMTP is configured: the Outgoing mail page reads it. */
  mailbox?: LocalMailbox;
  /** Show account mail (password resets) on the Outgoing mail page; never in production. */
  showAccountMail?: boolean;
  /** Invitation and reset requests allowed per address and per client. */
  limits?: MailRateLimits;
  /** Least time a password-reset request takes to answer. */
  resetAnswerMs?: number;
}

export const mailOptionsWithDefaults = (o: MailAppOptions = {}) => ({
  mailbox: o.mailbox,
  showAccountMail: o.showAccountMail ?? false,
  limits: o.limits ?? DEFAULT_MAIL_RATE_LIMITS,
  resetAnswerMs: o.resetAnswerMs ?? 400,
});
