import path from 'node:path';
import cron from 'node-cron';
import { z } from 'zod';
import { mailEnvShape, mailSettingsFrom, type MailSettings } from './mail/mail-config';

const booleanFromEnv = z.enum(['true', 'false', '1', '0', 'yes', 'no']).transform((v) => v === 'true' || v === '1' || v === 'yes');

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number().int().min(1).max(65535).default(8460),
  /** Full connection string; when absent the app starts its own PostgreSQL cluster. */
  DATABASE_URL: z.string().url().optional(),
  /** Port of the app's own PostgreSQL cluster (only used without DATABASE_URL). */
  PG_PORT: z.coerce.number().int().min(1024).max(65535).default(54329),
  /** Folder for the own cluster, the generated session secret and uploads. */
  DATA_DIR: z.string().min(1).default('.data'),
  /** Signs session cookies. Required in production; generated and kept in DATA_DIR otherwise. */
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters').optional(),
  /** Send cookies only over HTTPS. Defaults to on in production. */
  COOKIE_SECURE: booleanFromEnv.optional(),
  /** Number of reverse proxies in front of the app (for client IPs in rate limits). */
  TRUST_PROXY: z.coerce.number().int().min(0).max(10).default(0),
  /** Base URL printed into QR labels; defaults to http://HOST:PORT. */
  PUBLIC_URL: z.string().url().optional(),
  /** Seed the demo cellar into an empty database on start. */
  SEED_DEMO: booleanFromEnv.default(true),
  /** When each cellar's task snapshots are brought up to date (cron syntax); "off" leaves it to the first list. */
  TASK_SNAPSHOT_CRON: z
    .string()
    .trim()
    .refine((v) => v === 'off' || cron.validate(v), { message: 'must be a cron expression such as "*/5 * * * *", or off' })
    .default('*/5 * * * *'),
  /** SMTP, sender and outbox worker (server/mail/mail-config.ts); no SMTP means the local mailbox. */
  ...mailEnvShape,
});

export type AppConfig = Readonly<{
  env: 'development' | 'production' | 'test';
  host: string;
  port: number;
  databaseUrl: string | undefined;
  pgPort: number;
  dataDir: string;
  sessionSecret: string | undefined;
  cookieSecure: boolean;
  trustProxy: number;
  publicUrl: string;
  seedDemo: boolean;
  /** Cron expression of the task snapshot refresh, or null when it is off. */
  taskSnapshotSchedule: string | null;
  mail: MailSettings;
}>;

/**
 * Reads the environment once, validates it and returns a frozen config.
 * Throws a readable message naming every bad variable.
 * @param env - the environment to read, process.env by default
 */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  if (e.NODE_ENV === 'production' && !e.SESSION_SECRET) {
    throw new Error('Invalid environment:\n  SESSION_SECRET: required in production');
  }
  return Object.freeze({
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    databaseUrl: e.DATABASE_URL,
    pgPort: e.PG_PORT,
    dataDir: path.resolve(e.DATA_DIR),
    sessionSecret: e.SESSION_SECRET,
    cookieSecure: e.COOKIE_SECURE ?? e.NODE_ENV === 'production',
    trustProxy: e.TRUST_PROXY,
    publicUrl: (e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`).replace(/\/$/, ''),
    seedDemo: e.SEED_DEMO,
    taskSnapshotSchedule: e.TASK_SNAPSHOT_CRON === 'off' ? null : e.TASK_SNAPSHOT_CRON,
    mail: mailSettingsFrom(e),
  });
}
