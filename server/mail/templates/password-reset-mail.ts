import { renderHtml, renderText, type MailBody } from '../mail-layout';

export interface PasswordResetMailInput {
  displayName: string;
  resetUrl: string;
  validMinutes: number;
}

/** The "choose a new password" mail: one link, valid once and briefly. */
export function passwordResetMail(input: PasswordResetMailInput): { subject: string; text: string; html: string } {
  const body: MailBody = {
    heading: 'Choose a new password',
    paragraphs: [
      `Hello ${input.displayName}, someone (we hope you) asked to reset the password of your Cellarwright account.`,
      `The link works once, for ${input.validMinutes} minutes. Choosing a new password signs you out everywhere else.`,
    ],
    action: { label: 'Choose a new password', url: input.resetUrl },
    footer: ['If you did not ask for this, ignore this mail: your password stays as it is.'],
  };
  return { subject: 'Reset your Cellarwright password', text: renderText(body), html: renderHtml(body) };
}
