import { passwordResetAnswerSchema, type PasswordResetComplete } from '@shared/schemas/accounts';
import { request } from './http';
import { apiPath } from './paths';

/** Always the same answer, whether or not the address has an account. */
export const requestPasswordReset = (email: string): Promise<{ message: string }> =>
  request('POST', apiPath('auth', 'password-reset'), passwordResetAnswerSchema, { email });

export const completePasswordReset = (body: PasswordResetComplete): Promise<void> =>
  request('POST', apiPath('auth', 'password-reset', 'complete'), undefined, body);
