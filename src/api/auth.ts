import { sessionUserSchema, type SessionUser, type SignInRequest } from '@shared/schemas/auth';
import { request } from './http';

export const signIn = (body: SignInRequest): Promise<SessionUser> =>
  request('POST', '/api/auth/sign-in', sessionUserSchema, body);

export const signOut = (): Promise<void> => request('POST', '/api/auth/sign-out');

export const fetchMe = (): Promise<SessionUser> => request('GET', '/api/auth/me', sessionUserSchema);
