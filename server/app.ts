import 'reflect-metadata';
import express, { type Router } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import fs from 'node:fs';
import path from 'node:path';
import type { Pool } from 'pg';
import type { DataSource } from 'typeorm';
import { accountMailRoutes } from './accounts/account-mail.routes';
import { authRoutes } from './accounts/auth.routes';
import { invitationRoutes } from './accounts/invitations.routes';
import { createPassport } from './accounts/passport';
import { archiveRoutes } from './archive/archive.routes';
import { auditRoutes } from './audit/audit.routes';
import { batchRoutes } from './batches/batches.routes';
import { bottlingRoutes } from './bottles/bottling.routes';
import { caseRoutes } from './bottles/cases.routes';
import { lotRoutes } from './bottles/lots.routes';
import { calendarFeedRoutes, calendarFileRoutes } from './calendar/calendar.routes';
import { cellarListRoutes, cellarSettingsRoutes } from './cellars/cellars.routes';
import { memberRoutes } from './cellars/members.routes';
import { exportRoutes } from './exchange/exports.routes';
import { importRoutes } from './exchange/imports.routes';
import { deviceSeriesRoutes } from './devices/device-series.routes';
import { deviceRoutes } from './devices/devices.routes';
import { ingestRoutes, type DeviceReadingLimit } from './devices/ingest.routes';
import { cellarAccess, requireSignIn, type CellarAccessPolicy } from './http/access';
import { crossSiteGuard } from './http/cross-site-guard';
import { appShellFiles } from './http/app-shell-files';
import { clientAssets, clientShell } from './http/client-assets';
import { apiNotFound, errorHandler } from './http/error-handler';
import { healthRoutes } from './http/health.routes';
import { inlineScriptHashes } from './http/inline-script-hashes';
import { createSessionStore } from './http/session-store';
import { labelRoutes } from './labels/labels.routes';
import { mailOptionsWithDefaults, type MailAppOptions } from './mail/mail-app-options';
import { mailSettingsRoutes } from './mail/mail-settings.routes';
import { mailRoutes } from './mail/mail.routes';
import { unsubscribeRoutes } from './mail/unsubscribe.routes';
import { photoRoutes } from './photos/photos.routes';
import { batchPlanRoutes, planRoutes } from './plans/plans.routes';
import { rackRoutes } from './places/racks.routes';
import { scanRoutes } from './scan/scan.routes';
import { taskRoutes } from './tasks/tasks.routes';
import { todayRoutes } from './today/today.routes';
import { vesselRoutes } from './vessels/vessels.routes';

export interface AppOptions {
  dataSource: DataSource;
  sessionSecret: string;
  /** Send the session cookie only over HTTPS. */
  cookieSecure: boolean;
  /** Number of proxies in front of the app. */
  trustProxy?: number;
  /** Built client to serve (dist/); omitted in API-only tests. */
  clientDir?: string;
  /** Failed sign-ins allowed per e-mail address in 15 minutes. */
  signInAttempts?: number;
  /** Failed sign-ins allowed per client address in 15 minutes, over all e-mails. */
  signInAttemptsPerClient?: number;
  /** Base URL printed into QR labels (config PUBLIC_URL). */
  publicUrl?: string;
  /** Label code look-ups (/s, /api/scan, /api/cards) allowed per address per minute. */
  scanLookupsPerMinute?: number;
  /** Readings one device may post per window (server/devices/ingest.routes.ts); benches raise it. */
  deviceReadingLimit?: DeviceReadingLimit;
  /** Mail: the local mailbox for the Outgoing mail page, rate limits (server/mail/mail-app-options.ts). */
  mail?: MailAppOptions;
}

export const SESSION_COOKIE = 'cellarwright.sid';

/** Builds the Express app; `server/index.ts` starts it, tests mount it in-process. */
export function createApp(options: AppOptions): express.Express {
  const ds = options.dataSource;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', options.trustProxy ?? 0);

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // index.html's one inline script, allowed by its hash (shared/early-requests.ts).
          'script-src': ["'self'", ...inlineScriptHashes(options.clientDir)],
          'img-src': ["'self'", 'data:', 'blob:'],
          'media-src': ["'self'", 'blob:'],
          // The label preview shows the PDF it already fetched (src/components/labels/LabelPreview.vue).
          'frame-src': ["'self'", 'blob:'],
          // Phones on the local network reach the app over plain HTTP; do not force HTTPS there.
          'upgrade-insecure-requests': options.cookieSecure ? [] : null,
        },
      },
      strictTransportSecurity: options.cookieSecure,
    }),
  );
  // Before any body is read: a page on another site never changes anything here.
  app.use(crossSiteGuard(options.publicUrl));
  app.use(express.json({ limit: '1mb' }));
  // Digital hydrometers post readings with a device token and no session (server/devices/):
  // mounted before the session and sign-in machinery they never use, as they post every few minutes.
  app.use('/api/ingest', ingestRoutes(ds, options.deviceReadingLimit));

  // TypeORM's own pg pool serves the session store too: one pool per app.
  const pool = (ds.driver as unknown as { master: Pool }).master;
  app.use(
    session({
      name: SESSION_COOKIE,
      secret: options.sessionSecret,
      // Reads the user and their memberships with the session (server/http/session-store.ts).
      store: createSessionStore(pool),
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: options.cookieSecure,
        maxAge: 30 * 24 * 60 * 60 * 1000,
      },
    }),
  );
  const passport = createPassport(ds);
  app.use(passport.initialize());
  app.use(passport.session());

  const api = express.Router();
  api.use('/health', healthRoutes(ds));
  api.use(
    '/auth',
    authRoutes(ds, passport, { signInAttempts: options.signInAttempts ?? 10, signInAttemptsPerClient: options.signInAttemptsPerClient ?? 50 }),
  );
  // Invitations from the invited person's side, and password reset (server/accounts/).
  const mail = mailOptionsWithDefaults(options.mail);
  const mailLinkBase = options.publicUrl ?? 'http://127.0.0.1:8460';
  api.use('/auth', accountMailRoutes(ds, { publicUrl: mailLinkBase, limits: mail.limits, resetAnswerMs: mail.resetAnswerMs }));
  // The one-click unsubscribe link of reminder mails: signed, no sign-in.
  api.use('/mail', unsubscribeRoutes(ds, options.sessionSecret));
  // Everything about cellars needs a session; unknown /api paths still answer 404.
  api.use('/cellars', requireSignIn);
  api.use('/cellars', cellarListRoutes(ds));

  /** Mounts a resource router under a cellar, behind the one access gate. */
  const inCellar = (resource: string, router: Router, policy: CellarAccessPolicy) =>
    api.use(`/cellars/:cellarId/${resource}`, cellarAccess(ds, policy), router);
  inCellar('settings', cellarSettingsRoutes(ds), { write: 'keeper' });
  inCellar('members', memberRoutes(ds), { write: 'keeper' });
  inCellar('invitations', invitationRoutes(ds, { publicUrl: mailLinkBase, limits: mail.limits }), { write: 'keeper' });
  inCellar('mail', mailRoutes(ds, { mailbox: mail.mailbox, showAccountMail: mail.showAccountMail }), { write: 'keeper' });
  // Each member, Guests too, changes only their own e-mail reminders.
  inCellar('mail-settings', mailSettingsRoutes(ds), { write: 'guest' });
  inCellar('today', todayRoutes(ds), { write: 'hand' });
  inCellar('racks', rackRoutes(ds), { write: 'hand' });
  inCellar('vessels', vesselRoutes(ds), { write: 'hand' });
  // Bottling and photo uploads sit under a batch but have routers of their own.
  const photos = photoRoutes(ds);
  inCellar('batches/:batchId/bottlings', bottlingRoutes(ds), { write: 'hand' });
  inCellar('batches/:batchId/photos', photos.upload, { write: 'hand' });
  inCellar('batches/:batchId/plan', batchPlanRoutes(ds), { write: 'keeper' });
  inCellar('batches/:batchId/device-readings', deviceSeriesRoutes(ds), { write: 'keeper' });
  inCellar('devices', deviceRoutes(ds), { write: 'keeper' });
  inCellar('batches', batchRoutes(ds), { write: 'hand' });
  inCellar('plans', planRoutes(ds), { write: 'keeper' });
  inCellar('tasks', taskRoutes(ds), { write: 'hand' });
  // A member's own calendar feed: anyone may turn theirs on or off.
  inCellar('calendar-feed', calendarFeedRoutes(ds), { write: 'guest' });
  inCellar('lots', lotRoutes(ds), { write: 'hand' });
  inCellar('cases', caseRoutes(ds), { write: 'hand' });
  inCellar('photos', photos.serve, { write: 'hand' });
  inCellar('labels', labelRoutes(ds, { publicUrl: options.publicUrl ?? 'http://127.0.0.1:8460' }), { write: 'hand' });
  inCellar('exports', exportRoutes(ds), { write: 'keeper' });
  inCellar('audit', auditRoutes(ds), { write: 'keeper' });
  inCellar('imports', importRoutes(ds), { write: 'keeper' });
  inCellar('archive', archiveRoutes(ds), { write: 'keeper' });

  // Printed label URLs (outside /api because phones open them directly) and code look-ups: before
  // the /api router, whose forty cellar routes a scan (the most frequent request) need not walk.
  app.use(scanRoutes(ds, { lookupsPerMinute: options.scanLookupsPerMinute }));
  app.use('/api', api);
  // Calendar feeds (outside /api: calendar apps fetch them without a session).
  app.use(calendarFileRoutes(ds, { publicUrl: mailLinkBase }));
  app.use('/api', apiNotFound);

  if (options.clientDir && fs.existsSync(path.join(options.clientDir, 'index.html'))) {
    // The service worker and manifest first: never cached, so a new version is found.
    app.use(appShellFiles(options.clientDir));
    // Brotli or gzip made at build; hashed files cached for good, the rest revalidated (server/http/client-assets.ts).
    app.use(clientAssets(options.clientDir));
    // Client-side routes: any other GET gets the app shell.
    app.get('/{*splat}', clientShell(options.clientDir));
  }

  app.use(errorHandler);
  return app;
}
