import { dayMonthYear } from '../../../shared/date-words';
import { ROLE_LABELS, type Role } from '../../../shared/roles';
import { renderHtml, renderText, type MailBody } from '../mail-layout';

export interface InvitationMailInput {
  cellarName: string;
  inviterName: string;
  role: Role;
  acceptUrl: string;
  expiresAt: Date;
}

const ROLE_WORDS: Record<Role, string> = {
  keeper: 'manage the cellar, its members and its plans',
  hand: 'log readings, racking, additions and bottling',
  guest: 'see everything in the cellar without changing it',
};

/** The mail an invited person gets: who invites them to which cellar, and one link. */
export function invitationMail(input: InvitationMailInput): { subject: string; text: string; html: string } {
  const body: MailBody = {
    heading: `Join "${input.cellarName}" on Cellarwright`,
    paragraphs: [
      `${input.inviterName} invites you to the cellar "${input.cellarName}" as ${ROLE_LABELS[input.role]}: you will be able to ${ROLE_WORDS[input.role]}.`,
      `The link works once and until ${dayMonthYear(input.expiresAt.toISOString())}, ${input.expiresAt.toISOString().slice(11, 16)} UTC. If you have no account yet, you choose your name and password there.`,
    ],
    action: { label: 'Accept the invitation', url: input.acceptUrl },
    footer: ['If you did not expect this, ignore it: nobody joins a cellar without accepting.'],
  };
  return { subject: `${input.inviterName} invites you to "${input.cellarName}"`, text: renderText(body), html: renderHtml(body) };
}
