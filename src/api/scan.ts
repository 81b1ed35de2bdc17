import { bottleCardSchema, scanResultSchema, type BottleCard, type ScanResult } from '@shared/schemas/scan';
import { request } from './http';
import { apiPath } from './paths';

/** What a label code opens (404 when it opens nothing for this user). */
export const resolveScan = (code: string): Promise<ScanResult> =>
  request('GET', apiPath('scan', code), scanResultSchema);

/** The public bottle card of a case or lot code (404 unless its cellar shows cards). */
export const fetchBottleCard = (code: string): Promise<BottleCard> =>
  request('GET', apiPath('cards', code), bottleCardSchema);
