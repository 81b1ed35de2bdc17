import 'reflect-metadata';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from './app';
import { loadConfig } from './config';
import { createDataSource } from './db/data-source';
import { ensureDatabase } from './db/ensure-database';
import { PostgresMissingError, StartupError, startLocalPostgres, type LocalPostgres } from './db/local-postgres';
import { requireFreePort } from './core/port-check';
import { startMail } from './mail/mail-setup';
import { scheduleTaskSnapshotRefresh } from './tasks/task-snapshot-job';
import { printDemoSignIns, seedDemoIfEmpty } from './seed/demo';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** Outside production the session secret is made once and kept in the data folder. */
function sessionSecretFor(dataDir: string, configured: string | undefined): string {
  if (configured) return configured;
  const file = path.join(dataDir, 'session-secret');
  if (!fs.existsSync(file)) {
    fs.mkdirSync(dataDir, { recursive: true });
    fs.writeFileSync(file, crypto.randomBytes(32).toString('base64url'), { mode: 0o600 });
  }
  return fs.readFileSync(file, 'utf8').trim();
}

async function main(): Promise<void> {
  const config = loadConfig();
  // Before the database starts: a taken app port should not leave a cluster behind.
  await requireFreePort(config.host, config.port);
  let localPg: LocalPostgres | undefined;
  let databaseUrl = config.databaseUrl;
  if (!databaseUrl) {
    localPg = startLocalPostgres({ dataDir: path.join(config.dataDir, 'pg'), port: config.pgPort, adoptRunning: true });
    await ensureDatabase(localPg.adminUrl, 'cellarwright');
    databaseUrl = localPg.urlFor('cellarwright');
  }
  const stopDatabase = () => localPg?.stop();
  process.on('exit', stopDatabase);

  const dataSource = createDataSource(databaseUrl);
  await dataSource.initialize();
  const ran = await dataSource.runMigrations({ transaction: 'each' });
  if (ran.length) console.log(`Applied ${ran.length} migration(s): ${ran.map((m) => m.name).join(', ')}`);
  const seeded = config.seedDemo ? await seedDemoIfEmpty(dataSource) : false;
  // The configured SMTP server, or the local mailbox on loopback; and the outbox worker.
  const sessionSecret = sessionSecretFor(config.dataDir, config.sessionSecret);
  const mail = await startMail(dataSource, config.mail, { publicUrl: config.publicUrl, secret: sessionSecret });
  const taskSnapshots = config.taskSnapshotSchedule
    ? scheduleTaskSnapshotRefresh(dataSource, { schedule: config.taskSnapshotSchedule, log: (line) => console.log(line) })
    : null;

  const app = createApp({
    dataSource,
    sessionSecret,
    cookieSecure: config.cookieSecure,
    trustProxy: config.trustProxy,
    clientDir: path.join(projectRoot, 'dist'),
    publicUrl: config.publicUrl,
    mail: { mailbox: mail.mailbox, showAccountMail: config.env !== 'production' },
  });
  const server = app.listen(config.port, config.host, (err?: Error) => {
    // Taken between the check and now (another program was quicker): one line, then stop.
    if (err) {
      console.error(
        `Port ${config.port} on ${config.host} could not be used (${(err as NodeJS.ErrnoException).code ?? err.message}). Set PORT to a free port.`,
      );
      process.exit(1);
    }
    console.log(`\nCellarwright is running at http://${config.host}:${config.port}/`);
    if (config.seedDemo) printDemoSignIns(seeded);
  });

  let closing = false;
  const shutdown = (signal: string) => {
    if (closing) return;
    closing = true;
    console.log(`\n${signal}: stopping…`);
    server.close();
    server.closeAllConnections();
    Promise.all([mail.stop(), taskSnapshots?.stop()])
      .then(() => dataSource.destroy())
      .catch(() => undefined)
      .finally(() => {
        stopDatabase();
        process.exit(0);
      });
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((err: unknown) => {
  if (err instanceof PostgresMissingError || err instanceof StartupError || (err instanceof Error && err.message.startsWith('Invalid environment'))) {
    console.error(err.message);
  } else {
    console.error('Cellarwright could not start:', err);
  }
  process.exit(1);
});
