import { dayMonthYear } from '../../../shared/date-words';
import { daysBetween } from '../../../shared/domain/plans/local-dates';
import { daysWords } from '../../../shared/domain/plans/period-words';
import { renderHtml, renderText, type MailBody, type MailItem } from '../mail-layout';

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
  /** The cellar's local date, YYYY-MM-DD: what counts as overdue. */
  today: string;
  tasks: ReminderTask[];
  /** Signed one-click link that turns these mails off for this member and cellar. */
  unsubscribeUrl: string;
  /** 'digest': the day's list at the member's hour; 'reminder': one task as soon as it is due. */
  form: 'reminder' | 'digest';
}

/** "1 task", "8 tasks". */
const tasksWords = (n: number) => `${n} task${n === 1 ? '' : 's'}`;

/** "Due today", or the day and how long ago ("Due 11 Aug 2026, 116 days overdue"). Dates in words: a mail knows no one's date style. */
function dueWords(dueOn: string, today: string): string {
  const late = daysBetween(dueOn, today);
  if (late === 0) return 'Due today';
  if (late < 0) return `Due ${dayMonthYear(dueOn)}`;
  return `Due ${dayMonthYear(dueOn)}, ${daysWords(late)} overdue`;
}

/** "7 tasks overdue, 1 due today" (the subject's and the heading's count); the first number carries the noun. */
function countWords(tasks: readonly ReminderTask[], today: string): string {
  const groups: [number, string][] = [
    [tasks.filter((t) => t.dueOn < today).length, 'overdue'],
    [tasks.filter((t) => t.dueOn === today).length, 'due today'],
    [tasks.filter((t) => t.dueOn > today).length, 'due soon'],
  ];
  return groups
    .filter(([n]) => n > 0)
    .map(([n, words], i) => `${i === 0 ? tasksWords(n) : n} ${words}`)
    .join(', ');
}

/**
 * A reminder (one task) or a digest (the day's tasks), with the one-click unsubscribe headers
 * of RFC 8058 (List-Unsubscribe with an https/http URL plus List-Unsubscribe-Post).
 */
export function reminderMail(input: ReminderMailInput): { subject: string; text: string; html: string; headers: Record<string, string> } {
  if (input.tasks.length === 0) throw new Error('A reminder needs at least one task.');
  // Longest waiting first (a snoozed task counts from the day its snooze ended); ties keep their order.
  const byDue = [...input.tasks].sort((a, b) => a.dueOn.localeCompare(b.dueOn));
  const overdue = (t: ReminderTask) => t.dueOn < input.today;
  const items: MailItem[] = byDue.map((t) => ({
    title: t.title,
    subject: t.subject,
    detail: dueWords(t.dueOn, input.today),
    urgent: overdue(t),
    url: t.url,
  }));
  const smallPrint = {
    footer: [`You get these because of your e-mail settings in "${input.cellarName}".`],
    footerLink: { label: 'Stop them with one click', url: input.unsubscribeUrl },
  };
  const single = input.form === 'reminder' ? input.tasks[0]! : null;
  const body: MailBody = single
    ? {
        heading: `${single.title} is ${overdue(single) ? 'overdue' : 'due'}`,
        paragraphs: [`Hello ${input.recipientName}, in "${input.cellarName}": ${single.title} for ${single.subject}.`, `${items[0]!.detail}.`],
        action: { label: 'Open it', url: single.url },
        ...smallPrint,
      }
    : {
        heading: `${countWords(input.tasks, input.today)} in "${input.cellarName}"`,
        paragraphs: [`Hello ${input.recipientName}, here is the cellar's work, the longest waiting first, each with a link to its batch.`],
        items,
        ...smallPrint,
      };
  return {
    subject: single
      ? `${overdue(single) ? 'Overdue' : 'Due'}: ${single.title} (${single.subject})`
      : `${input.cellarName}: ${countWords(input.tasks, input.today)}`,
    text: renderText(body),
    html: renderHtml(body),
    headers: {
      'List-Unsubscribe': `<${input.unsubscribeUrl}>`,
      'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
    },
  };
}
