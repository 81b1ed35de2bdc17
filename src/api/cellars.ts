import { z } from 'zod';
import { cellarSchema, memberSchema, type Cellar, type CellarUpdate, type Member } from '@shared/schemas/cellars';
import type { Role } from '@shared/roles';
import { request, cellarPath } from './http';

export const fetchCellar = (cellarId: string): Promise<Cellar> => request('GET', cellarPath(cellarId, 'settings'), cellarSchema);

export const updateCellar = (cellarId: string, changes: CellarUpdate): Promise<Cellar> =>
  request('PATCH', cellarPath(cellarId, 'settings'), cellarSchema, changes);

export const fetchMembers = (cellarId: string): Promise<Member[]> => request('GET', cellarPath(cellarId, 'members'), z.array(memberSchema));

export const changeMemberRole = (cellarId: string, memberId: string, role: Role): Promise<Member[]> =>
  request('PATCH', cellarPath(cellarId, 'members', memberId), z.array(memberSchema), { role });

export const removeMember = (cellarId: string, memberId: string): Promise<void> => request('DELETE', cellarPath(cellarId, 'members', memberId));
