import { passwordResetAnswerSchema, type PasswordResetComplete } from '@shared/schemas/accounts';
import { request, apiPath } from './http';

/** Always the same answer, whether or not the address has an account. */
export const requestPasswordReset = (email: string): Promise<{ message: string }> =>
  request('POST', apiPath('auth', 'password-reset'), passwordResetAnswerSchema, { email });

export const completePasswordReset = (body: PasswordResetComplete): Promise<void> =>
  request('POST', apiPath('auth', 'password-reset', 'complete'), undefined, body);
