import nodemailer from 'nodemailer';
import type { SmtpSettings } from './mail-config';

/** What the outbox worker needs of a transport; nodemailer's transporter is one. */
export interface MailTransport {
  sendMail(message: {
    from: string;
    to: string;
    subject: string;
    text: string;
    html: string;
    messageId: string;
    headers: Record<string, string>;
  }): Promise<unknown>;
  close(): void;
}

// A hung server must not hold a claimed message for long: the worker retries later instead.
const TIMEOUTS = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 };

/** A transport to the configured SMTP server. */
export function smtpTransport(settings: SmtpSettings): MailTransport {
  if ('url' in settings) return nodemailer.createTransport({ url: settings.url, ...TIMEOUTS }) as unknown as MailTransport;
  return nodemailer.createTransport({
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    auth: settings.user ? { user: settings.user, pass: settings.password } : undefined,
    ...TIMEOUTS,
  }) as unknown as MailTransport;
}

/** A transport to the local mailbox on loopback (plain SMTP, no TLS: it never leaves the machine). */
export function loopbackTransport(host: string, port: number): MailTransport {
  return nodemailer.createTransport({ host, port, secure: false, ignoreTLS: true, ...TIMEOUTS }) as unknown as MailTransport;
}
