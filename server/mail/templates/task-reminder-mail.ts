import { renderHtml, renderText, type MailBody } from '../mail-layout';

/** One due task as a reminder or digest line shows it. */
export interface ReminderTask {
  title: string;
  /** Local date in the cellar's time zone, YYYY-MM-DD. */
  dueOn: string;
  /** What it concerns, e.g. "Heather melomel in Demijohn 3". */
  subject: string;
  /** Straight to the batch or vessel. */
  url: string;
}

export interface ReminderMailInput {
  cellarName: string;
  recipientName: string;
  tasks: ReminderTask[];
  /** Signed one-click link that turns these mails off for this member and cellar. */
  unsubscribeUrl: string;
  /** 'digest': the day's list at the member's hour; 'reminder': one task as soon as it is due. */
  form: 'reminder' | 'digest';
}

/**
 * A reminder (one task) or a digest (the day's tasks), with the one-click unsubscribe headers
 * of RFC 8058 (List-Unsubscribe with an https/http URL plus List-Unsubscribe-Post).
 */
export function reminderMail(input: ReminderMailInput): { subject: string; text: string; html: string; headers: Record<string, string> } {
  if (input.tasks.length === 0) throw new Error('A reminder needs at least one task.');
  const lines = input.tasks.map((t) => `${t.dueOn}: ${t.title} (${t.subject}) ${t.url}`);
  const single = input.form === 'reminder' ? input.tasks[0]! : null;
  const body: MailBody = {
    heading: single ? `${single.title} is due` : `${input.tasks.length} task${input.tasks.length === 1 ? '' : 's'} due in "${input.cellarName}"`,
    paragraphs: single
      ? [`Hello ${input.recipientName}, in "${input.cellarName}": ${single.title} for ${single.subject}, due ${single.dueOn}.`]
      : [`Hello ${input.recipientName}, what is due in "${input.cellarName}":`, ...lines],
    action: single ? { label: 'Open it', url: single.url } : undefined,
    footer: [`You get these because of your e-mail settings in "${input.cellarName}".`, `Stop them with one click: ${input.unsubscribeUrl}`],
  };
  return {
    subject: single
      ? `Due: ${single.title} (${single.subject})`
      : `Due today in "${input.cellarName}": ${input.tasks.length} task${input.tasks.length === 1 ? '' : 's'}`,
    text: renderText(body),
    html: renderHtml(body),
    headers: {
      'List-Unsubscribe': `<${input.unsubscribeUrl}>`,
      'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
    },
  };
}
