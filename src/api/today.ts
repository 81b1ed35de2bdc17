import { todaySchema, type Today } from '@shared/schemas/today';
import { request, cellarPath } from './http';

export const fetchToday = (cellarId: string): Promise<Today> => request('GET', cellarPath(cellarId, 'today'), todaySchema);
