import { Router, type Request } from 'express';
import type { DataSource } from 'typeorm';
import { invitationSignUpSchema, passwordResetCompleteSchema, passwordResetRequestSchema, tokenRequestSchema } from '../../shared/schemas/accounts';
import { inTransaction } from '../core/unit-of-work';
import { handle } from '../http/handle';
import { requireSignIn } from '../http/access';
import { acceptInvitation, previewInvitation, signUpWithInvitation } from './invitation-acceptance';
import { mailRequestLimit, tokenAttemptLimit, type MailRateLimits } from './mail-rate-limits';
import { completePasswordReset, requestPasswordReset } from './password-reset';
import { describeSessionUser } from './session-user';

export interface AccountMailRouteOptions {
  publicUrl: string;
  limits: MailRateLimits;
  /**
   * The reset request always takes at least this long, so its answer time does not tell
   * whether the address has an account (the known path writes and the unknown one does not).
   */
  resetAnswerMs: number;
}

export const RESET_ANSWER =
  'If an account uses that address, a mail with a link to choose a new password is on its way. The link works for one hour.';

const delay = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

function logIn(req: Request, user: Express.User): Promise<void> {
  return new Promise((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
}

/** Under /api/auth: invitations seen from the invited person's side, and password reset. */
export function accountMailRoutes(ds: DataSource, options: AccountMailRouteOptions): Router {
  const router = Router();
  const tokenLimiter = tokenAttemptLimit(ds, options.limits);

  router.post(
    '/invitation/preview',
    tokenLimiter,
    handle({ body: tokenRequestSchema }, ({ body }) => inTransaction(ds, 'read', (tx) => previewInvitation(tx, body.token))),
  );
  router.post(
    '/invitation/accept',
    requireSignIn,
    tokenLimiter,
    handle({ body: tokenRequestSchema }, async ({ body }, req) => {
      await inTransaction(ds, 'write', (tx) => acceptInvitation(tx, body.token, req.user!));
      return describeSessionUser(ds, req.user!);
    }),
  );
  router.post(
    '/invitation/sign-up',
    tokenLimiter,
    handle({ body: invitationSignUpSchema }, async ({ body }, req, res) => {
      const user = await inTransaction(ds, 'write', (tx) => signUpWithInvitation(tx, body.token, body.displayName, body.password));
      await logIn(req, user);
      res.status(201);
      return describeSessionUser(ds, user);
    }),
  );

  router.post(
    '/password-reset',
    mailRequestLimit(ds, 'reset', options.limits, (req) =>
      String(req.body?.email ?? '')
        .trim()
        .toLowerCase(),
    ),
    handle({ body: passwordResetRequestSchema }, async ({ body }, _req, res) => {
      const floor = delay(options.resetAnswerMs);
      try {
        await inTransaction(ds, 'write', (tx) => requestPasswordReset(tx, body.email, options.publicUrl));
      } catch (err) {
        // A failure must not answer differently from "no such account"; it is logged instead.
        console.error('[mail] password reset request failed', err);
      }
      await floor;
      res.status(202);
      return { message: RESET_ANSWER };
    }),
  );
  router.post(
    '/password-reset/complete',
    tokenLimiter,
    handle({ body: passwordResetCompleteSchema }, async ({ body }) => {
      await inTransaction(ds, 'write', (tx) => completePasswordReset(tx, body.token, body.password));
    }),
  );
  return router;
}
