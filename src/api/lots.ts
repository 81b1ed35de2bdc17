import { z } from 'zod';
import { departureSchema, lotDetailSchema, lotPageSchema, type LotDetail, type LotPage } from '@shared/schemas/bottles';
import { request, cellarPath, withQuery } from './http';

export { lotDetailSchema, lotPageSchema, type LotDetail, type LotPage };
export type Departure = z.infer<typeof departureSchema>;

export interface LotListFilters {
  q?: string;
  inStock?: boolean;
  page?: number;
  pageSize?: number;
}

/** One page of bottle lots with their cases, newest first. */
export function listLots(cellarId: string, filters: LotListFilters = {}): Promise<LotPage> {
  const { q, inStock, page, pageSize } = filters;
  // A page or page size of 0 means "the server's default", like an empty one.
  return request(
    'GET',
    withQuery(cellarPath(cellarId, 'lots'), { q, inStock, page: page || undefined, pageSize: pageSize || undefined }),
    lotPageSchema,
  );
}

/** A lot, its cases and every bottle that has left it. */
export const fetchLot = (cellarId: string, lotId: string): Promise<LotDetail> => request('GET', cellarPath(cellarId, 'lots', lotId), lotDetailSchema);
