import { z } from 'zod';
import { mailStatusSchema, receivedMailSchema, type MailStatus, type ReceivedMailView } from '@shared/schemas/mail';
import { request, cellarPath } from './http';

/** Keepers: whether mail goes to the local mailbox, and the cellar's mail that is stuck. */
export const fetchMailStatus = (cellarId: string): Promise<MailStatus> => request('GET', cellarPath(cellarId, 'mail'), mailStatusSchema);

/** Keepers, local mailbox mode only: what the local mailbox received for this cellar. */
export const fetchOutgoingMail = (cellarId: string): Promise<ReceivedMailView[]> =>
  request('GET', cellarPath(cellarId, 'mail', 'outgoing'), z.array(receivedMailSchema));

export const retryMail = (cellarId: string, mailId: string): Promise<void> => request('POST', cellarPath(cellarId, 'mail', mailId, 'retry'));
