import { bottleCardSchema, scanResultSchema, type BottleCard, type ScanResult } from '@shared/schemas/scan';
import { keptLabel } from '@/offline/kept-records';
import { ApiError, request, apiPath } from './http';

/**
 * What a label code opens (404 when it opens nothing for this user). Without signal, the
 * record this phone kept for the code (src/offline/kept-records.ts), if it kept one.
 */
export async function resolveScan(code: string): Promise<ScanResult> {
  try {
    return await request('GET', apiPath('scan', code), scanResultSchema);
  } catch (err) {
    if (!(err instanceof ApiError) || err.code !== 'offline') throw err;
    const kept = await keptLabel(code);
    if (!kept) throw err;
    return { kind: kept.kind, id: kept.id, cellarId: kept.cellarId, url: kept.url };
  }
}

/** The public bottle card of a case or lot code (404 unless its cellar shows cards). */
export const fetchBottleCard = (code: string): Promise<BottleCard> => request('GET', apiPath('cards', code), bottleCardSchema);
