import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import fs from 'node:fs';
import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { makeCellarWithCrew, makeUser, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { linkIn, mailTo, privateDataSource, testMailbox, type TestMail } from '../helpers/mail';
import { shoutedControls } from '../helpers/a11y-audit';
import { signInThroughForm } from '../helpers/browser-app';
import { chromiumAvailable, launchBrowser } from '../tools/browser';

const distDir = path.resolve(import.meta.dirname, '../../dist');
const missing = !chromiumAvailable() ? 'Chromium' : !fs.existsSync(path.join(distDir, 'index.html')) ? 'the built client (npx vite build)' : null;

/**
 * Invitation and password reset end to end, in Chromium, against the built client served by
 * the real app with the local mailbox: mail is delivered by the outbox worker's pass and read
 * from the mailbox, as a newcomer would read it on the Outgoing mail page.
 */
(missing && process.env.CI !== 'true' ? describe.skip : describe)('invitation and password reset, in Chromium', () => {
  let ds: DataSource;
  let mail: TestMail;
  let server: Server;
  let baseUrl: string;
  let context: BrowserContext;
  let closeBrowser: () => Promise<void>;
  let crew: CellarCrew;

  beforeAll(async () => {
    ds = await privateDataSource('e2e_mail');
    mail = await testMailbox();
    server = await new Promise<Server>((resolve) => {
      const s = createApp({
        dataSource: ds,
        sessionSecret: 'test-secret-that-is-long-enough-0123456789',
        cookieSecure: false,
        clientDir: distDir,
        // The links in the mail must point at this server: its port is known once it listens.
        publicUrl: 'http://127.0.0.1:0',
        mail: { mailbox: mail.mailbox, showAccountMail: true, resetAnswerMs: 50 },
      }).listen(0, '127.0.0.1', () => resolve(s));
    });
    baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    // No service worker: this suite is not about working offline (see describeInBrowser).
    const browser = await launchBrowser({ serviceWorkers: 'block' });
    context = browser.context;
    closeBrowser = browser.close;
    crew = await makeCellarWithCrew(ds, 'Mail test cellar');
  });

  afterAll(async () => {
    await closeBrowser?.();
    await new Promise((resolve) => server?.close(resolve));
  });

  /** The link a mail holds, moved onto this test server's port. */
  async function linkFromMail(to: string, route: string): Promise<string> {
    await mail.deliverAll(ds);
    const [received] = await mailTo(mail.mailbox, to);
    expect(received, `a mail to ${to}`).toBeDefined();
    const link = linkIn(received!.text, 'http://127.0.0.1:0/');
    expect(new URL(link).pathname).toBe(route);
    return link.replace('http://127.0.0.1:0', baseUrl);
  }

  async function newPage(width = 390): Promise<Page> {
    const page = await context.newPage();
    await page.setViewportSize({ width, height: 844 });
    return page;
  }

  it('a Keeper invites a new address; the mail shows on Outgoing mail; its link creates the account and the membership', async () => {
    const keeper = await newPage(1280);
    await signInThroughForm(keeper, baseUrl, crew.keeper.email, TEST_PASSWORD);
    await keeper.goto(`${baseUrl}/c/${crew.cellar.id}/settings`);
    await keeper.click('[data-test=invite-member]');
    await keeper.fill('[data-test=invite-email]', 'brand.new@example.test');
    await keeper.click('[data-test=send-invitation]');
    await keeper.waitForSelector('[data-test="invitation-brand.new@example.test"]');

    await mail.deliverAll(ds);
    await keeper.reload();
    await keeper.click('[data-test=open-outgoing-mail]');
    await keeper.waitForSelector('[data-test=local-mailbox-note]');
    expect(await keeper.textContent('[data-test=mailbox]')).toContain('invites you to "Mail test cellar"');
    // Opened, a mail shows its two views as tabs, in sentence case like every control.
    await keeper.click('[data-test=mailbox] .q-expansion-item >> nth=0');
    await keeper.waitForSelector('[data-test=mail-html]');
    expect(await shoutedControls(keeper)).toEqual([]);
    await keeper.close();
    await context.clearCookies();

    const link = await linkFromMail('brand.new@example.test', '/invitation');
    const invitee = await newPage();
    await invitee.goto(link);
    await invitee.waitForSelector('[data-test=invitation-summary]');
    expect(await invitee.textContent('[data-test=invitation-summary]')).toContain('brand.new@example.test');
    await invitee.fill('[data-test=display-name]', 'Brand New');
    await invitee.fill('[data-test=new-password]', 'short');
    await invitee.click('[data-test=sign-up]');
    expect(await invitee.textContent('.q-field--error')).toContain('at least 10 characters');
    await invitee.fill('[data-test=new-password]', 'a-good-long-password');
    await invitee.click('[data-test=sign-up]');
    await invitee.waitForURL(new RegExp(`/c/${crew.cellar.id}/today$`));
    const members = await ds.query(
      `SELECT m.role FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = 'brand.new@example.test' AND m.cellar_id = $1`,
      [crew.cellar.id],
    );
    expect(members).toEqual([{ role: 'hand' }]);
    await invitee.close();
    await context.clearCookies();

    // The same link again: a clear page, not a form.
    const again = await newPage();
    await again.goto(link);
    await again.waitForSelector('[data-test=invitation-problem]');
    expect(await again.textContent('[data-test=invitation-problem]')).toContain('already been used');
    await again.close();
  });

  it('an existing account accepts after signing in', async () => {
    const person = await makeUser(ds, 'Existing Maker');
    const keeper = await newPage(1280);
    await signInThroughForm(keeper, baseUrl, crew.keeper.email, TEST_PASSWORD);
    await keeper.goto(`${baseUrl}/c/${crew.cellar.id}/settings`);
    await keeper.click('[data-test=invite-member]');
    await keeper.fill('[data-test=invite-email]', person.email);
    await keeper.click('[data-test=send-invitation]');
    await keeper.waitForSelector(`[data-test="invitation-${person.email}"]`);
    await keeper.close();
    await context.clearCookies();

    const link = await linkFromMail(person.email, '/invitation');
    const page = await newPage();
    await page.goto(link);
    await page.click('[data-test=sign-in-to-accept]');
    await page.waitForURL(/\/sign-in\?next=/);
    await page.fill('[data-test=email]', person.email);
    await page.fill('[data-test=password]', TEST_PASSWORD);
    await page.click('[data-test=sign-in]');
    await page.click('[data-test=accept-invitation]');
    await page.waitForURL(new RegExp(`/c/${crew.cellar.id}/today$`));
    await page.close();
    await context.clearCookies();
  });

  it('an expired invitation gives a clear page', async () => {
    // The first test's invitation, as if it had never been used and its 7 days had passed.
    await ds.query(`UPDATE invitations SET accepted_at = NULL, expires_at = now() - interval '1 minute' WHERE email = 'brand.new@example.test'`);
    const [received] = await mailTo(mail.mailbox, 'brand.new@example.test');
    const link = linkIn(received!.text, 'http://127.0.0.1:0/').replace('http://127.0.0.1:0', baseUrl);
    const page = await newPage();
    await page.goto(link);
    await page.waitForSelector('[data-test=invitation-problem]');
    expect(await page.textContent('[data-test=invitation-problem]')).toContain('expired');
    await page.close();
  });

  it('"Forgot password?" mails a link that sets a new password once', async () => {
    const person = await makeUser(ds, 'Forgetful Maker');
    const page = await newPage();
    await page.goto(`${baseUrl}/sign-in`);
    await page.click('[data-test=forgot-password]');
    await page.fill('[data-test=reset-email]', person.email);
    await page.click('[data-test=send-reset]');
    await page.waitForSelector('[data-test=reset-requested]');
    expect(await page.textContent('[data-test=reset-requested]')).toContain('If an account uses that address');

    const link = await linkFromMail(person.email, '/reset-password');
    await page.goto(link);
    await page.fill('[data-test=new-password]', 'my-new-cellar-password');
    await page.click('[data-test=save-password]');
    await page.waitForSelector('[data-test=password-changed]');
    await page.click('[data-test=go-sign-in]');
    await page.fill('[data-test=email]', person.email);
    await page.fill('[data-test=password]', 'my-new-cellar-password');
    await page.click('[data-test=sign-in]');
    // Not a member of any cellar: signed in, told so on the sign-in page.
    await page.waitForSelector('[data-test=sign-in-error]');
    expect(await page.textContent('[data-test=sign-in-error]')).toContain('not a member of any cellar');
    await page.close();
    await context.clearCookies();

    const reused = await newPage();
    await reused.goto(link);
    await reused.fill('[data-test=new-password]', 'yet-another-password');
    await reused.click('[data-test=save-password]');
    await reused.waitForSelector('[data-test=link-problem]');
    expect(await reused.textContent('[data-test=link-problem]')).toContain('expired or has already been used');
    await reused.close();
  });
});
