import { Router, type Response } from 'express';
import type { DataSource } from 'typeorm';
import { TASK_WHATS } from '../../shared/schemas/plans';
import { inTransaction } from '../core/unit-of-work';
import { brandColours } from '../../shared/palette';
import { escapeHtml } from './mail-layout';
import { verifyUnsubscribe } from './unsubscribe-links';

function page(res: Response, status: number, heading: string, body: string): void {
  res
    .status(status)
    .type('html')
    .send(
      `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">` +
        `<title>${escapeHtml(heading)} · Cellarwright</title></head>` +
        `<body style="font-family:Helvetica,Arial,sans-serif;max-width:32rem;margin:3rem auto;padding:0 1rem;color:#232134">` +
        `<h1 style="font-size:1.4rem;color:${brandColours.primary}">${escapeHtml(heading)}</h1>${body}</body></html>`,
    );
}

/**
 * /api/mail/unsubscribe — the link in every reminder. GET shows a button (link checkers and
 * previews open links, and must not unsubscribe anyone); POST turns the member's reminders for
 * that cellar off: from the button, or from a mail client's one-click request (RFC 8058).
 * No sign-in: the signature in the link is the permission.
 */
export function unsubscribeRoutes(ds: DataSource, secret: string): Router {
  const router = Router();
  const cellarName = async (cellarId: string) =>
    ((await ds.query(`SELECT name FROM cellars WHERE id = $1`, [cellarId]))[0] as { name: string } | undefined)?.name;

  router.get('/unsubscribe', async (req, res) => {
    const who = verifyUnsubscribe(secret, req.query);
    const name = who && (await cellarName(who.cellarId));
    if (!who || !name)
      return page(res, 400, 'This link does not work', '<p>Open the link from the mail again, or change your e-mail settings in the app.</p>');
    page(
      res,
      200,
      'Stop reminder mails?',
      `<p>You will get no more reminder or digest mails from “${escapeHtml(name)}”. You can turn them on again in the app's settings.</p>` +
        `<form method="post"><button type="submit" style="background:${brandColours.secondary};color:#fff;border:0;padding:10px 18px;border-radius:6px;font-size:1rem">Stop these mails</button></form>`,
    );
  });

  router.post('/unsubscribe', async (req, res) => {
    const who = verifyUnsubscribe(secret, req.query);
    if (!who) return page(res, 400, 'This link does not work', '<p>Open the link from the mail again.</p>');
    await inTransaction(ds, 'write', (tx) =>
      tx.query(
        `INSERT INTO member_mail_settings (cellar_id, user_id, delivery, kinds)
         SELECT m.cellar_id, m.user_id, 'off', $3::text[] FROM memberships m WHERE m.cellar_id = $1 AND m.user_id = $2
         ON CONFLICT (cellar_id, user_id) DO UPDATE SET delivery = 'off', updated_at = now()`,
        [who.cellarId, who.userId, [...TASK_WHATS]],
      ),
    );
    page(res, 200, 'Done: no more reminder mails', '<p>You can turn them on again in the app’s settings whenever you like.</p>');
  });
  return router;
}
