import crypto from 'node:crypto';
import type { AddressInfo } from 'node:net';
import type { SMTPServer } from 'smtp-server';
import { CELLAR_HEADER } from './outbox';

/** One message the local mailbox received, as the Outgoing mail page shows it. */
export interface ReceivedMail {
  id: string;
  receivedAt: string;
  envelopeFrom: string;
  envelopeTo: string[];
  messageId: string;
  /** From the cellar header; null for account mail. */
  cellarId: string | null;
  subject: string;
  text: string;
  /** Empty when the message had no HTML part. */
  html: string;
  /** The message exactly as received (tests parse it themselves). */
  raw: Buffer;
}

/**
 * A real SMTP server on loopback inside the app's process, used when no SMTP is configured and
 * by the tests: the app delivers to it over SMTP like to any server, and nothing leaves the
 * machine. It keeps the latest messages in memory.
 */
export interface LocalMailbox {
  readonly host: string;
  readonly port: number;
  /** Newest first. */
  messages(): ReceivedMail[];
  clear(): void;
  /** While set, every message is refused with a temporary error (451) carrying this reason. */
  refuse(reason: string | null): void;
  close(): Promise<void>;
}

export interface LocalMailboxOptions {
  /** 0 (default) picks a free port. */
  port?: number;
  /** How many messages to keep. */
  keep?: number;
  onReceive?: (mail: ReceivedMail) => void;
}

/** Starts the local mailbox. smtp-server and mailparser are loaded only here, when it is used. */
export async function startLocalMailbox(options: LocalMailboxOptions = {}): Promise<LocalMailbox> {
  const [{ SMTPServer }, { simpleParser }] = await Promise.all([import('smtp-server'), import('mailparser')]);
  const keep = options.keep ?? 500;
  let kept: ReceivedMail[] = [];
  let refusal: string | null = null;

  const refused = (): Error | null => (refusal === null ? null : Object.assign(new Error(refusal), { responseCode: 451 }));

  const server: SMTPServer = new SMTPServer({
    name: 'cellarwright-local-mailbox',
    banner: 'Cellarwright local mailbox: nothing leaves this machine',
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 5 * 1024 * 1024,
    onMailFrom(_address, _session, callback) {
      callback(refused());
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then((parsed) => {
            const cellarHeader = parsed.headers.get(CELLAR_HEADER.toLowerCase());
            const mail: ReceivedMail = {
              id: crypto.randomUUID(),
              receivedAt: new Date().toISOString(),
              envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
              envelopeTo: session.envelope.rcptTo.map((r) => r.address),
              messageId: parsed.messageId ?? '',
              cellarId: typeof cellarHeader === 'string' ? cellarHeader : null,
              subject: parsed.subject ?? '',
              text: parsed.text ?? '',
              html: typeof parsed.html === 'string' ? parsed.html : '',
              raw,
            };
            kept = [mail, ...kept].slice(0, keep);
            options.onReceive?.(mail);
            callback();
          })
          .catch((err: unknown) => callback(err instanceof Error ? err : new Error(String(err))));
      });
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', () => resolve());
  });
  // Later errors (a client dropping its connection) must not bring the app down.
  server.on('error', () => undefined);
  const { port } = server.server.address() as AddressInfo;

  return {
    host: '127.0.0.1',
    port,
    messages: () => [...kept],
    clear: () => {
      kept = [];
    },
    refuse: (reason) => {
      refusal = reason;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
