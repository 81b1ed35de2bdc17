import type { DataSource } from 'typeorm';
import { Batch } from '../../server/entities/batch.entity';
import { BottleCaseRow } from '../../server/entities/bottle-case.entity';
import { BottleLotRow } from '../../server/entities/bottle-lot.entity';
import { Cellar } from '../../server/entities/cellar.entity';
import { Placement } from '../../server/entities/placement.entity';
import { Rack } from '../../server/entities/rack.entity';
import { Shelf } from '../../server/entities/shelf.entity';
import { Vessel } from '../../server/entities/vessel.entity';
import { randomLabelCode } from '../../server/services/label-codes';

/**
 * Records for the label and scanning tests, written straight through repositories (the
 * vessel, batch and bottling services are someone else's and may change under us).
 * Invented data only.
 */

export async function makeBatch(
  ds: DataSource,
  cellarId: string,
  seed: Partial<Pick<Batch, 'name' | 'kind' | 'startedOn' | 'og' | 'lastReadingSg'>> = {},
): Promise<Batch> {
  const repo = ds.getRepository(Batch);
  return repo.save(
    repo.create({
      cellarId,
      name: seed.name ?? `Heather honey mead ${randomLabelCode()}`,
      kind: seed.kind ?? 'traditional-mead',
      ingredients: [],
      yeastName: 'Invented yeast 71',
      yeastToleranceAbv: 14,
      plannedVolumeL: 20,
      startedOn: seed.startedOn ?? '2026-01-10',
      og: seed.og === undefined ? 1.11 : seed.og,
      lastReadingSg: seed.lastReadingSg ?? null,
      lastReadingAt: seed.lastReadingSg ? new Date() : null,
    }),
  );
}

/** A vessel, empty or holding `batch` (then 90 % full). */
export async function makeVessel(
  ds: DataSource,
  cellarId: string,
  seed: { name?: string; batch?: Batch | null; capacityL?: number; code?: string } = {},
): Promise<Vessel> {
  const repo = ds.getRepository(Vessel);
  const capacityL = seed.capacityL ?? 23;
  const holding = seed.batch ?? null;
  return repo.save(
    repo.create({
      cellarId,
      code: seed.code ?? randomLabelCode(),
      name: seed.name ?? `Carboy ${randomLabelCode().slice(0, 3)}`,
      kind: 'carboy',
      material: 'glass',
      capacityL,
      cleaningState: 'dirty',
      batchId: holding?.id ?? null,
      volumeL: holding ? capacityL * 0.9 : null,
      filledAt: holding ? new Date() : null,
    }),
  );
}

/** A bottle lot of `batch` and its cases of `perCase` bottles. */
export async function makeLotWithCases(
  ds: DataSource,
  cellarId: string,
  batch: Batch,
  seed: { cases?: number; perCase?: number; bottleMl?: number; sulfiteAdded?: boolean; abvEstimate?: number | null; note?: string; bottledOn?: string } = {},
): Promise<{ lot: BottleLotRow; cases: BottleCaseRow[] }> {
  const caseCount = seed.cases ?? 2;
  const perCase = seed.perCase ?? 12;
  const lots = ds.getRepository(BottleLotRow);
  const lot = await lots.save(
    lots.create({
      cellarId,
      batchId: batch.id,
      code: randomLabelCode(),
      bottledOn: seed.bottledOn ?? '2026-02-02',
      bottleMl: seed.bottleMl ?? 750,
      bottleCount: caseCount * perCase,
      closure: 'cork',
      carbonation: 'still',
      sulfiteAdded: seed.sulfiteAdded ?? true,
      abvEstimate: seed.abvEstimate === undefined ? 12.4 : seed.abvEstimate,
      note: seed.note ?? '',
    }),
  );
  const caseRepo = ds.getRepository(BottleCaseRow);
  const cases: BottleCaseRow[] = [];
  for (let n = 1; n <= caseCount; n++) {
    cases.push(
      await caseRepo.save(
        caseRepo.create({ cellarId, lotId: lot.id, code: randomLabelCode(), number: n, bottlesInitial: perCase, bottlesLeft: perCase }),
      ),
    );
  }
  return { lot, cases };
}

/** A rack with shelves of the given slot counts, top shelf first. */
export async function makeRack(ds: DataSource, cellarId: string, name: string, slots: number[]): Promise<{ rack: Rack; shelves: Shelf[] }> {
  const rack = await ds.getRepository(Rack).save(ds.getRepository(Rack).create({ cellarId, name, description: '' }));
  const shelfRepo = ds.getRepository(Shelf);
  const shelves = await shelfRepo.save(slots.map((slotCount, i) => shelfRepo.create({ rackId: rack.id, number: i + 1, slotCount })));
  return { rack, shelves };
}

/** Records a vessel or case in a slot. */
export async function placeIn(
  ds: DataSource,
  cellarId: string,
  shelfId: string,
  slot: number,
  thing: { vesselId: string } | { caseId: string },
): Promise<void> {
  await ds.getRepository(Placement).insert({ cellarId, shelfId, slot, vesselId: null, caseId: null, ...thing });
}

/** Turns the cellar's public bottle cards on or off. */
export async function setPublicCards(ds: DataSource, cellarId: string, on: boolean): Promise<void> {
  await ds.getRepository(Cellar).update({ id: cellarId }, { publicBottleCards: on });
}
