import type { DataSource } from 'typeorm';
import type { BottleLot } from '../../shared/schemas/bottles';
import type { BottleRequest } from '../../shared/schemas/journal';
import type { Batch } from '../../server/entities/batch.entity';
import { BottleCaseRow } from '../../server/entities/bottle-case.entity';
import { BottleLotRow } from '../../server/entities/bottle-lot.entity';
import type { Vessel } from '../../server/entities/vessel.entity';
import { randomLabelCode } from '../../server/labels/label-codes';
import { makeBatchInVessels } from './batches';
import type { Agent, CellarCrew } from './crew';
import { daysAgo } from './dates';

/**
 * Bottle lots and cases: written straight into the database (`makeLotWithCases`, `makeCase`)
 * or bottled through the API (`makeLotViaApi`). Invented data only.
 */

/** A bottle lot of `batch` and its cases of `perCase` bottles, all full. */
export async function makeLotWithCases(
  ds: DataSource,
  cellarId: string,
  batch: Batch,
  seed: {
    cases?: number;
    perCase?: number;
    bottleMl?: number;
    sulfiteAdded?: boolean;
    abvEstimate?: number | null;
    note?: string;
    bottledOn?: string;
  } = {},
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

/**
 * One case, numbered and filled as told, in a lot of its own (24 bottles of 750 mL bottled
 * 2026-03-01): for a case part drunk or on a shelf.
 */
export async function makeCase(
  ds: DataSource,
  cellarId: string,
  batchId: string,
  seed: { number?: number; bottlesInitial?: number; bottlesLeft?: number } = {},
): Promise<{ id: string; lotId: string }> {
  const [lot] = await ds.query(
    `INSERT INTO bottle_lots (cellar_id, batch_id, code, bottled_on, bottle_ml, bottle_count, closure, carbonation, sulfite_added)
     VALUES ($1, $2, $3, '2026-03-01', 750, 24, 'cork', 'still', false) RETURNING id`,
    [cellarId, batchId, randomLabelCode()],
  );
  const initial = seed.bottlesInitial ?? 12;
  const [box] = await ds.query(
    `INSERT INTO bottle_cases (cellar_id, lot_id, code, number, bottles_initial, bottles_left) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    [cellarId, lot.id, randomLabelCode(), seed.number ?? 1, initial, seed.bottlesLeft ?? initial],
  );
  return { id: box.id, lotId: lot.id };
}

/** A bottling request with ordinary choices; override what a test is about. */
export function bottleRequest(vessels: Vessel[], overrides: Partial<BottleRequest> = {}): BottleRequest {
  return {
    from: vessels.map((v) => ({ vesselId: v.id, expectedVersion: v.version })),
    bottleMl: 750,
    bottleCount: 12,
    perCase: 12,
    closure: 'cork',
    carbonation: 'still',
    sulfiteAdded: false,
    bottledOn: daysAgo(0),
    ...overrides,
  };
}

/**
 * A bottled lot made through the API (fermentation confirmed, so no readings are needed).
 * @returns the lot as the API answered it
 */
export async function makeLotViaApi(
  ds: DataSource,
  agent: Agent,
  crew: CellarCrew,
  options: { bottles: number; perCase?: number; name?: string; bottleMl?: number },
): Promise<{ batch: Batch; lot: BottleLot }> {
  const bottleMl = options.bottleMl ?? 750;
  const { batch, vessels } = await makeBatchInVessels(ds, crew, { name: options.name, volumesL: [(options.bottles * bottleMl) / 1000 + 1] });
  const res = await agent
    .post(`/api/cellars/${crew.cellar.id}/batches/${batch.id}/bottlings`)
    .send(bottleRequest(vessels, { bottleCount: options.bottles, perCase: options.perCase ?? 12, bottleMl, confirmNotFinished: true }));
  if (res.status !== 201) throw new Error(`bottling failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { batch, lot: res.body.lot as BottleLot };
}
