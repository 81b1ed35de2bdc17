import { sessionUserSchema, type SessionUser, type SignInRequest } from '@shared/schemas/auth';
import { request, apiPath } from './http';

export const signIn = (body: SignInRequest): Promise<SessionUser> => request('POST', apiPath('auth', 'sign-in'), sessionUserSchema, body);

export const signOut = (): Promise<void> => request('POST', apiPath('auth', 'sign-out'));

export const fetchMe = (): Promise<SessionUser> => request('GET', apiPath('auth', 'me'), sessionUserSchema);
