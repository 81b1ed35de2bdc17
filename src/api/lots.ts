import { z } from 'zod';
import { bottleLotSchema, departureSchema } from '@shared/schemas/bottles';
import { pageOf } from '@shared/schemas/vessels';
import { request } from './http';

const base = (cellarId: string) => `/api/cellars/${encodeURIComponent(cellarId)}/lots`;

export const lotPageSchema = pageOf(bottleLotSchema);
export type LotPage = z.infer<typeof lotPageSchema>;
export const lotDetailSchema = bottleLotSchema.extend({ departures: z.array(departureSchema) });
export type LotDetail = z.infer<typeof lotDetailSchema>;
export type Departure = z.infer<typeof departureSchema>;

export interface LotListFilters {
  q?: string;
  inStock?: boolean;
  page?: number;
  pageSize?: number;
}

/** One page of bottle lots with their cases, newest first. */
export function listLots(cellarId: string, filters: LotListFilters = {}): Promise<LotPage> {
  const params = new URLSearchParams();
  if (filters.q) params.set('q', filters.q);
  if (filters.inStock !== undefined) params.set('inStock', String(filters.inStock));
  if (filters.page) params.set('page', String(filters.page));
  if (filters.pageSize) params.set('pageSize', String(filters.pageSize));
  const text = params.toString();
  return request('GET', `${base(cellarId)}${text ? `?${text}` : ''}`, lotPageSchema);
}

/** A lot, its cases and every bottle that has left it. */
export const fetchLot = (cellarId: string, lotId: string): Promise<LotDetail> =>
  request('GET', `${base(cellarId)}/${encodeURIComponent(lotId)}`, lotDetailSchema);
