import type { EntityManager } from 'typeorm';
import { Cellar } from '../entities/cellar.entity';

/** The cellar's settings (time zone, sanitising and headspace limits). */
export function loadCellar(tx: EntityManager, cellarId: string): Promise<Cellar> {
  return tx.getRepository(Cellar).findOneByOrFail({ id: cellarId });
}
