import type { DataSource } from 'typeorm';
import { startLocalMailbox, type LocalMailbox } from './local-mailbox';
import type { MailSettings } from './mail-config';
import { startOutboxWorker, type RunningWorker } from './outbox-worker';
import { scheduleReminderPass } from './reminder-job';
import { loopbackTransport, smtpTransport, type MailTransport } from './smtp-transport';

export interface RunningMail {
  /** Set only when no SMTP is configured: the in-process mailbox every mail goes to. */
  mailbox: LocalMailbox | undefined;
  transport: MailTransport;
  worker: RunningWorker;
  stop(): Promise<void>;
}

/**
 * Starts mail for the app: the configured SMTP server, or else the local mailbox on loopback,
 * the outbox worker that delivers to it, and the reminder pass on its cron schedule.
 */
export async function startMail(
  ds: DataSource,
  settings: MailSettings,
  links: { publicUrl: string; secret: string },
  log: (line: string) => void = console.log,
): Promise<RunningMail> {
  let mailbox: LocalMailbox | undefined;
  let transport: MailTransport;
  if (settings.smtp) {
    transport = smtpTransport(settings.smtp);
  } else {
    mailbox = await startLocalMailbox({
      onReceive: (mail) => log(`[mail] local mailbox received "${mail.subject}" for ${mail.envelopeTo.join(', ')}`),
    });
    transport = loopbackTransport(mailbox.host, mailbox.port);
    log(`[mail] No SMTP configured: mail goes to the local mailbox (127.0.0.1:${mailbox.port}); Keepers read it under Settings → Outgoing mail.`);
  }
  const worker = startOutboxWorker(ds, {
    transport,
    from: settings.from,
    maxAttempts: settings.maxAttempts,
    intervalMs: settings.workerIntervalMs,
    log,
  });
  const reminders = settings.reminderSchedule
    ? scheduleReminderPass(ds, { schedule: settings.reminderSchedule, publicUrl: links.publicUrl, secret: links.secret, log })
    : null;
  return {
    mailbox,
    transport,
    worker,
    stop: async () => {
      await reminders?.stop();
      await worker.stop();
      transport.close();
      await mailbox?.close();
    },
  };
}
