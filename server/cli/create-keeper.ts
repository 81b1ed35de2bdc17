/**
 * Creates an account and a new cellar it keeps — the way in for a real cellar when the demo is
 * not wanted. Usage (the password is read from CELLARWRIGHT_PASSWORD or asked for):
 *   npm run create-keeper -- "Ada Example" ada@example.test "Ada's cellar"
 * Uses DATABASE_URL, or the app's own cluster in DATA_DIR (start the app once first).
 */
import 'reflect-metadata';
import fs from 'node:fs';
import path from 'node:path';
import readline from 'node:readline/promises';
import { z } from 'zod';
import { hashPassword } from '../accounts/passwords';
import { loadConfig } from '../config';
import { createDataSource } from '../db/data-source';
import { ensureDatabase } from '../db/ensure-database';
import { startLocalPostgres } from '../db/local-postgres';
import { Cellar } from '../entities/cellar.entity';
import { Membership } from '../entities/membership.entity';
import { User } from '../entities/user.entity';

const argsSchema = z.tuple([
  z.string().trim().min(1, 'give a display name').max(80),
  z
    .string()
    .trim()
    .toLowerCase()
    .pipe(z.email({ message: 'give an e-mail address' })),
  z.string().trim().min(1, 'give the cellar a name').max(80),
]);
const passwordSchema = z.string().min(10, 'use at least 10 characters').max(200);

async function askPassword(): Promise<string> {
  if (process.env.CELLARWRIGHT_PASSWORD) return process.env.CELLARWRIGHT_PASSWORD;
  const rl = readline.createInterface({ input: process.stdin, output: process.stdout });
  try {
    return await rl.question('Password for the new account (at least 10 characters): ');
  } finally {
    rl.close();
  }
}

async function main(): Promise<void> {
  const args = argsSchema.safeParse(process.argv.slice(2));
  if (!args.success) {
    console.error(`Usage: npm run create-keeper -- "Display name" email "Cellar name"\n${args.error.issues.map((i) => `  ${i.message}`).join('\n')}`);
    process.exit(2);
  }
  const [displayName, email, cellarName] = args.data;
  const password = passwordSchema.safeParse(await askPassword());
  if (!password.success) {
    console.error(`Password: ${password.error.issues[0]!.message}`);
    process.exit(2);
  }

  const config = loadConfig();
  let url = config.databaseUrl;
  let stop = () => {};
  if (!url) {
    if (!fs.existsSync(path.join(config.dataDir, 'pg'))) {
      console.error('No database yet: start the app once (npm start), or set DATABASE_URL.');
      process.exit(1);
    }
    const local = startLocalPostgres({ dataDir: path.join(config.dataDir, 'pg'), port: config.pgPort, log: () => undefined });
    await ensureDatabase(local.adminUrl, 'cellarwright');
    url = local.urlFor('cellarwright');
    stop = () => local.stop();
  }
  const ds = createDataSource(url);
  try {
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    if (await ds.getRepository(User).existsBy({ email })) {
      console.error(`An account with ${email} already exists.`);
      process.exitCode = 1;
      return;
    }
    const passwordHash = await hashPassword(password.data);
    await ds.transaction(async (tx) => {
      const user = await tx.getRepository(User).save({ email, displayName, passwordHash });
      const cellar = await tx.getRepository(Cellar).save({ name: cellarName });
      await tx.getRepository(Membership).save({ cellarId: cellar.id, userId: user.id, role: 'keeper' });
    });
    console.log(`Created ${displayName} <${email}>, Keeper of "${cellarName}". Sign in with that e-mail and password.`);
  } finally {
    await ds.destroy().catch(() => undefined);
    stop();
  }
}

await main();
