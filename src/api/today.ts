import { todaySchema, type Today } from '@shared/schemas/today';
import { request } from './http';

export const fetchToday = (cellarId: string): Promise<Today> =>
  request('GET', `/api/cellars/${encodeURIComponent(cellarId)}/today`, todaySchema);
