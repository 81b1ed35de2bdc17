import { simpleParser } from 'mailparser';
import nodemailer from 'nodemailer';
import { describe, expect, it } from 'vitest';
import { escapeHtml } from '../../server/mail/mail-layout';
import { invitationMail } from '../../server/mail/templates/invitation-mail';
import { passwordResetMail } from '../../server/mail/templates/password-reset-mail';
import { reminderMail } from '../../server/mail/templates/task-reminder-mail';

/** Builds the message as nodemailer would send it, and reads it back as a mail client would. */
async function asReceived(mail: { subject: string; text: string; html: string; headers?: Record<string, string> }) {
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true });
  const info = await transport.sendMail({ from: 'a@example.test', to: 'b@example.test', ...mail });
  return simpleParser(info.message as Buffer);
}

describe('our mail design', () => {
  it('escapes what people typed in the HTML body, and keeps it as typed in the text body', async () => {
    const mail = invitationMail({
      cellarName: '<script>alert(1)</script> & Co',
      inviterName: 'Ana "Mead" O\'Hara',
      role: 'hand',
      acceptUrl: 'http://cellar.example.test/invitation?token=abc',
      expiresAt: new Date('2026-12-10T09:30:00Z'),
    });
    expect(mail.html).not.toContain('<script>');
    expect(mail.html).toMatch(/^<!doctype html><html lang="en"><head><meta charset="utf-8">/);
    expect(mail.html).toContain('<title>Join &quot;&lt;script&gt;alert(1)&lt;/script&gt; &amp; Co&quot; on Cellarwright</title>');
    expect(mail.html).toContain('&lt;script&gt;alert(1)&lt;/script&gt; &amp; Co');
    expect(mail.text).toContain('"<script>alert(1)</script> & Co"');
    expect(mail.text).toContain('until 10 Dec 2026, 09:30 UTC');
    expect(escapeHtml(`a<b>"c"&'d'`)).toBe('a&lt;b&gt;&quot;c&quot;&amp;&#39;d&#39;');
    const received = await asReceived(mail);
    expect(received.text).toContain('Accept the invitation: http://cellar.example.test/invitation?token=abc');
    expect(received.html).toContain('href="http://cellar.example.test/invitation?token=abc"');
  });

  it('says how long a reset link works', () => {
    const mail = passwordResetMail({ displayName: 'Kim', resetUrl: 'http://x.test/reset-password?token=t', validMinutes: 60 });
    expect(mail.text).toContain('for 60 minutes');
    expect(mail.text).toContain('Choose a new password: http://x.test/reset-password?token=t');
  });
});

describe('reminder and digest mails', () => {
  const task = (title: string, subject: string, url: string, dueOn = '2026-12-03') => ({ title, subject, url, dueOn });
  const unsubscribeUrl = 'http://cellar.example.test/api/mail/unsubscribe?m=abc.sig';
  const today = '2026-12-03';

  it('carry the one-click unsubscribe headers of RFC 8058 and link straight to the batch', async () => {
    const mail = reminderMail({
      cellarName: 'Fernhollow',
      recipientName: 'Maren',
      today,
      form: 'reminder',
      unsubscribeUrl,
      tasks: [task('Rack', 'Heather melomel in Demijohn 3', 'http://cellar.example.test/c/1/batches/2')],
    });
    const received = await asReceived(mail);
    // Long headers are folded onto a second line (RFC 5322 §2.2.3); unfold before comparing.
    const header = (key: string) => received.headerLines.find((h) => h.key === key)?.line.replace(/\r\n\s+/g, ' ');
    expect(header('list-unsubscribe')).toBe(`List-Unsubscribe: <${unsubscribeUrl}>`);
    expect(header('list-unsubscribe-post')).toBe('List-Unsubscribe-Post: List-Unsubscribe=One-Click');
    expect(received.subject).toBe('Due: Rack (Heather melomel in Demijohn 3)');
    expect(received.text).toContain('Due today.');
    expect(received.text).toContain('Open it: http://cellar.example.test/c/1/batches/2');
    expect(received.text).toContain(`Stop them with one click: ${unsubscribeUrl}`);
    expect(received.html).toContain(`<a href="${unsubscribeUrl}" style="color:#666666">Stop them with one click</a>`);
    expect(received.html).toContain('href="http://cellar.example.test/c/1/batches/2"');
  });

  it('say how long an overdue task has waited, with the day in words', () => {
    // 11 Aug 2026 to 3 Dec 2026, counted on a calendar: 20 + 30 + 31 + 30 + 3 = 114 days.
    const mail = reminderMail({
      cellarName: 'Fernhollow',
      recipientName: 'Maren',
      today,
      form: 'reminder',
      unsubscribeUrl,
      tasks: [task('Rack off the lees', 'Linden metheglin in Big Glass', 'http://x.test/a', '2026-08-11')],
    });
    expect(mail.subject).toBe('Overdue: Rack off the lees (Linden metheglin in Big Glass)');
    expect(mail.text).toContain('Due 11 Aug 2026, 114 days overdue.');
    expect(mail.text.split('\n')[0]).toBe('Rack off the lees is overdue');
  });

  it('list every task of the day in a digest, the longest waiting first, each title a link to its batch', () => {
    const mail = reminderMail({
      cellarName: 'Fernhollow',
      recipientName: 'Maren',
      today,
      form: 'digest',
      unsubscribeUrl,
      tasks: [
        task('Rack', 'Cyser', 'http://x.test/a'),
        task('Check headspace', 'Pyment', 'http://x.test/b', '2026-12-02'),
        task('Take out <oak>', 'Bochet', 'http://x.test/c?a=1&b=2', '2026-11-30'),
      ],
    });
    expect(mail.subject).toBe('Fernhollow: 2 tasks overdue, 1 due today');
    expect(mail.text.split('\n')[0]).toBe('2 tasks overdue, 1 due today in "Fernhollow"');
    expect(mail.text).toContain('Take out <oak>: Bochet\nDue 30 Nov 2026, 3 days overdue\nhttp://x.test/c?a=1&b=2\n\n');
    expect(mail.text).toContain('Check headspace: Pyment\nDue 2 Dec 2026, 1 day overdue\nhttp://x.test/b\n\n');
    expect(mail.text).toContain('Rack: Cyser\nDue today\nhttp://x.test/a\n\n');
    const order = ['Take out <oak>', 'Check headspace:', 'Rack:'].map((t) => mail.text.indexOf(t));
    expect(order).toEqual([...order].sort((a, b) => a - b));
    expect(mail.html).toContain('<a href="http://x.test/c?a=1&amp;b=2" style="color:#33304f;font-weight:bold">Take out &lt;oak&gt;</a>');
    expect(mail.html).not.toContain('<oak>');
    // The overdue lines carry the warning colour as well as the words.
    expect(mail.html).toMatch(/color:#b3261e">Due 30 Nov 2026, 3 days overdue</);
    expect(mail.html).toMatch(/color:#55536a">Due today</);
  });

  it('count a digest with nothing overdue, and one with nothing due today', () => {
    const base = { cellarName: 'Fernhollow', recipientName: 'Maren', today, form: 'digest' as const, unsubscribeUrl };
    expect(reminderMail({ ...base, tasks: [task('Rack', 'Cyser', 'http://x.test/a')] }).subject).toBe('Fernhollow: 1 task due today');
    expect(reminderMail({ ...base, tasks: [task('Rack', 'Cyser', 'http://x.test/a', '2026-12-01')] }).subject).toBe('Fernhollow: 1 task overdue');
    // A task falling due after the day of the mail (for a caller that looks ahead) counts as due soon.
    const ahead = [task('Rack', 'Cyser', 'http://x.test/a', '2026-12-05'), task('Taste', 'Cyser', 'http://x.test/a')];
    expect(reminderMail({ ...base, tasks: ahead }).subject).toBe('Fernhollow: 1 task due today, 1 due soon');
  });

  it('refuses to send an empty reminder', () => {
    expect(() => reminderMail({ cellarName: 'F', recipientName: 'M', today, form: 'digest', unsubscribeUrl, tasks: [] })).toThrow(
      /at least one task/,
    );
  });
});
