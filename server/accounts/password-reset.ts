import type { EntityManager } from 'typeorm';
import { BadRequestError } from '../http/errors';
import { enqueueMail } from '../mail/outbox';
import { returningRows } from '../mail/returning';
import { passwordResetMail } from '../mail/templates/password-reset-mail';
import { hashMailToken, newMailToken } from './mail-tokens';
import { hashPassword } from './passwords';

/** How long a reset link works. */
export const RESET_VALID_MINUTES = 60;

export const resetUrl = (publicUrl: string, token: string) => `${publicUrl}/reset-password?token=${token}`;

/**
 * Starts a reset for the account with this address, if there is one: a new token (any older
 * unused one stops working) and the mail, in the caller's transaction. Says nothing about
 * whether the account exists; the route answers the same either way.
 */
export async function requestPasswordReset(tx: EntityManager, email: string, publicUrl: string): Promise<void> {
  const [user]: { id: string; display_name: string }[] = await tx.query(`SELECT id, display_name FROM users WHERE email = $1`, [email]);
  if (!user) return;
  await tx.query(`UPDATE password_resets SET used_at = now() WHERE user_id = $1 AND used_at IS NULL`, [user.id]);
  const { token, hash } = newMailToken();
  await tx.query(`INSERT INTO password_resets (user_id, token_hash, expires_at) VALUES ($1, $2, now() + make_interval(mins => $3))`, [
    user.id,
    hash,
    RESET_VALID_MINUTES,
  ]);
  const mail = passwordResetMail({ displayName: user.display_name, resetUrl: resetUrl(publicUrl, token), validMinutes: RESET_VALID_MINUTES });
  await enqueueMail(tx, { kind: 'password-reset', cellarId: null, to: email, ...mail }, publicUrl);
}

/**
 * Sets the new password if the token is unused and unexpired (using it up), and ends every
 * session of that person: whoever knew the old password is signed out.
 */
export async function completePasswordReset(tx: EntityManager, token: string, password: string): Promise<void> {
  const [reset] = await returningRows<{ user_id: string }>(
    tx,
    `UPDATE password_resets SET used_at = now()
      WHERE token_hash = $1 AND used_at IS NULL AND expires_at > now()
      RETURNING user_id`,
    [hashMailToken(token)],
  );
  if (!reset) {
    throw new BadRequestError('This reset link has expired or has already been used. Ask for a new one from the sign-in page.');
  }
  await tx.query(`UPDATE users SET password_hash = $2 WHERE id = $1`, [reset.user_id, await hashPassword(password)]);
  await tx.query(`UPDATE password_resets SET used_at = now() WHERE user_id = $1 AND used_at IS NULL`, [reset.user_id]);
  await tx.query(`DELETE FROM session WHERE sess -> 'passport' ->> 'user' = $1`, [reset.user_id]);
}
