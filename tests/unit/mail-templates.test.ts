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
    expect(mail.html).toContain('&lt;script&gt;alert(1)&lt;/script&gt; &amp; Co');
    expect(mail.text).toContain('"<script>alert(1)</script> & Co"');
    expect(mail.text).toContain('until 2026-12-10 09:30 UTC');
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
  const task = (title: string, subject: string, url: string) => ({ title, subject, url, dueOn: '2026-12-03' });
  const unsubscribeUrl = 'http://cellar.example.test/api/mail/unsubscribe?m=abc.sig';

  it('carry the one-click unsubscribe headers of RFC 8058 and link straight to the batch', async () => {
    const mail = reminderMail({
      cellarName: 'Fernhollow',
      recipientName: 'Maren',
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
    expect(received.text).toContain('Open it: http://cellar.example.test/c/1/batches/2');
    expect(received.text).toContain(unsubscribeUrl);
    expect(received.html).toContain('href="http://cellar.example.test/c/1/batches/2"');
  });

  it('lists every task of the day in a digest', () => {
    const mail = reminderMail({
      cellarName: 'Fernhollow',
      recipientName: 'Maren',
      form: 'digest',
      unsubscribeUrl,
      tasks: [task('Rack', 'Cyser', 'http://x.test/a'), task('Check headspace', 'Pyment', 'http://x.test/b')],
    });
    expect(mail.subject).toBe('Due today in "Fernhollow": 2 tasks');
    expect(mail.text).toContain('2026-12-03: Rack (Cyser) http://x.test/a');
    expect(mail.text).toContain('2026-12-03: Check headspace (Pyment) http://x.test/b');
  });

  it('refuses to send an empty reminder', () => {
    expect(() => reminderMail({ cellarName: 'F', recipientName: 'M', form: 'digest', unsubscribeUrl, tasks: [] })).toThrow(/at least one task/);
  });
});
