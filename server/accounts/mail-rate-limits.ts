import type { Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import { sharedLimit } from '../http/shared-rate-limit';

export interface MailRateLimits {
  /** Requests per address (the invited or reset e-mail) per hour. */
  perEmailPerHour: number;
  /** Requests per client IP per hour. */
  perIpPerHour: number;
  /** Attempts with an invitation or reset token per client IP per quarter hour (60 when not given). */
  tokenAttemptsPerQuarterHour?: number;
}

export const DEFAULT_MAIL_RATE_LIMITS: MailRateLimits = { perEmailPerHour: 5, perIpPerHour: 30 };

const HOUR_SECONDS = 60 * 60;
const QUARTER_HOUR_SECONDS = 15 * 60;

/** 429 with Retry-After and the wait in whole minutes. */
function refuse(res: Response, wait: number, what: string): void {
  const minutes = Math.max(1, Math.ceil(wait / 60));
  res
    .status(429)
    .set('Retry-After', String(wait))
    .json({ error: 'too_many_requests', message: `${what}. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.` });
}

/**
 * Limits a request that sends mail, counted in PostgreSQL so every app instance shares the
 * counts: per e-mail address (nobody's inbox is flooded from many places) and per client IP
 * (nobody walks a list of addresses). Every request counts, known address or not, so the
 * limit itself tells nothing about accounts.
 * @param emailOf - the address the request mails (or what stands for it, e.g. an invitation id)
 */
export function mailRequestLimit(ds: DataSource, name: string, limits: MailRateLimits, emailOf: (req: Request) => string): RequestHandler {
  const perIp = sharedLimit(ds, { name: `${name}-ip`, points: limits.perIpPerHour, windowSeconds: HOUR_SECONDS });
  const perEmail = sharedLimit(ds, { name: `${name}-email`, points: limits.perEmailPerHour, windowSeconds: HOUR_SECONDS });
  return async (req, res, next) => {
    const [ipWait, emailWait] = await Promise.all([perIp.take(ipKeyGenerator(req.ip ?? '')), perEmail.take(emailOf(req))]);
    const wait = Math.max(ipWait, emailWait);
    if (wait === 0) return next();
    refuse(res, wait, emailWait ? 'Too many mails to this address' : 'Too many requests from here');
  };
}

/**
 * Limits attempts with a mailed token (an invitation or a password reset) per client IP,
 * counted in PostgreSQL like the mail limits, so several app instances share one count.
 * Tokens have 256 bits, so guessing is hopeless; this only stops a flood of attempts.
 */
export function tokenAttemptLimit(ds: DataSource, limits: MailRateLimits): RequestHandler {
  const perIp = sharedLimit(ds, { name: 'mail-token-ip', points: limits.tokenAttemptsPerQuarterHour ?? 60, windowSeconds: QUARTER_HOUR_SECONDS });
  return async (req, res, next) => {
    const wait = await perIp.take(ipKeyGenerator(req.ip ?? ''));
    if (wait === 0) return next();
    refuse(res, wait, 'Too many attempts');
  };
}
