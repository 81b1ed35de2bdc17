import crypto from 'node:crypto';
import { simpleParser, type ParsedMail } from 'mailparser';
import type { DataSource } from 'typeorm';
import { afterAll, inject } from 'vitest';
import { createDataSource } from '../../server/db/data-source';
import { recreateDatabase } from '../../server/db/ensure-database';
import { startLocalMailbox, type LocalMailbox, type ReceivedMail } from '../../server/mail/local-mailbox';
import { deliverDueMail, type OutboxWorkerOptions } from '../../server/mail/outbox-worker';
import { loopbackTransport, type MailTransport } from '../../server/mail/smtp-transport';

/**
 * Mail in tests: the app's own local mailbox (a real SMTP server on loopback), a database of
 * the file's own (so a delivery pass never takes another test file's mail), and mailparser to
 * read what arrived.
 */

/** A fresh, migrated database for one test file, dropped with it. */
export async function privateDataSource(label: string): Promise<DataSource> {
  const shared = new URL(inject('databaseUrl'));
  const name = `${shared.pathname.slice(1)}_${label}_${crypto.randomBytes(3).toString('hex')}`;
  const admin = new URL(shared);
  admin.pathname = '/postgres';
  await recreateDatabase(admin.toString(), name);
  const own = new URL(shared);
  own.pathname = `/${name}`;
  const ds = createDataSource(own.toString());
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  afterAll(async () => {
    await ds.destroy();
  });
  return ds;
}

export interface TestMail {
  mailbox: LocalMailbox;
  transport: MailTransport;
  /** One delivery pass to the mailbox, with the given clock and limits. */
  deliver(ds: DataSource, options?: Partial<OutboxWorkerOptions>): ReturnType<typeof deliverDueMail>;
  /** Delivery passes until nothing is due. */
  deliverAll(ds: DataSource, options?: Partial<OutboxWorkerOptions>): Promise<void>;
}

export const TEST_FROM = 'Cellarwright tests <tests@local.invalid>';

/** The local mailbox and a transport to it, closed after the file. */
export async function testMailbox(): Promise<TestMail> {
  const mailbox = await startLocalMailbox();
  const transport = loopbackTransport(mailbox.host, mailbox.port);
  afterAll(async () => {
    transport.close();
    await mailbox.close();
  });
  const deliver: TestMail['deliver'] = (ds, options = {}) => deliverDueMail(ds, { transport, from: TEST_FROM, ...options });
  const deliverAll: TestMail['deliverAll'] = async (ds, options = {}) => {
    for (;;) {
      const pass = await deliver(ds, options);
      if (pass.sent + pass.deferred + pass.failed === 0) return;
    }
  };
  return { mailbox, transport, deliver, deliverAll };
}

/** What the mailbox holds for one address, parsed by mailparser from the raw message. */
export async function mailTo(mailbox: LocalMailbox, address: string): Promise<ParsedMail[]> {
  const received = mailbox.messages().filter((m: ReceivedMail) => m.envelopeTo.includes(address));
  return Promise.all(received.map((m) => simpleParser(m.raw)));
}

/** The first link in a text body that starts with `prefix`. */
export function linkIn(text: string | undefined, prefix: string): string {
  const match = (text ?? '').match(new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\S+`));
  if (!match) throw new Error(`no link starting ${prefix} in:\n${text}`);
  return match[0];
}

/** The token query parameter of a mailed link. */
export const tokenOf = (link: string) => new URL(link).searchParams.get('token')!;
