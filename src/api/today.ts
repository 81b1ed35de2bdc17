import { todaySchema, type Today } from '@shared/schemas/today';
import { request } from './http';
import { cellarPath } from './paths';

export const fetchToday = (cellarId: string): Promise<Today> =>
  request('GET', cellarPath(cellarId, 'today'), todaySchema);
