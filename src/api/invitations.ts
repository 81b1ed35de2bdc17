import { z } from 'zod';
import { invitationPreviewSchema, invitationSchema, type Invitation, type InvitationPreview, type InvitationSignUp } from '@shared/schemas/accounts';
import { sessionUserSchema, type SessionUser } from '@shared/schemas/auth';
import type { Role } from '@shared/roles';
import { request, apiPath, cellarPath } from './http';

/** The Keeper's side: invite, list, resend, withdraw. */
export const fetchInvitations = (cellarId: string): Promise<Invitation[]> =>
  request('GET', cellarPath(cellarId, 'invitations'), z.array(invitationSchema));

export const invite = (cellarId: string, email: string, role: Role): Promise<Invitation> =>
  request('POST', cellarPath(cellarId, 'invitations'), invitationSchema, { email, role });

export const resendInvitation = (cellarId: string, invitationId: string): Promise<Invitation> =>
  request('POST', cellarPath(cellarId, 'invitations', invitationId, 'resend'), invitationSchema);

export const revokeInvitation = (cellarId: string, invitationId: string): Promise<void> =>
  request('DELETE', cellarPath(cellarId, 'invitations', invitationId));

/** The invited person's side, with the token from the mailed link. */
export const previewInvitation = (token: string): Promise<InvitationPreview> =>
  request('POST', apiPath('auth', 'invitation', 'preview'), invitationPreviewSchema, { token });

export const acceptInvitation = (token: string): Promise<SessionUser> =>
  request('POST', apiPath('auth', 'invitation', 'accept'), sessionUserSchema, { token });

export const signUpWithInvitation = (body: InvitationSignUp): Promise<SessionUser> =>
  request('POST', apiPath('auth', 'invitation', 'sign-up'), sessionUserSchema, body);
