import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import type { BottleLot } from '../../shared/schemas/bottles';
import type { BottleRequest, JournalPayload } from '../../shared/schemas/journal';
import { Batch } from '../../server/entities/batch.entity';
import { Rack } from '../../server/entities/rack.entity';
import { Shelf } from '../../server/entities/shelf.entity';
import { Vessel } from '../../server/entities/vessel.entity';
import type { CellarContext } from '../../server/services/cellar.service';
import { appendEntry } from '../../server/services/journal-writer';
import { randomLabelCode } from '../../server/services/label-codes';
import type { CellarCrew } from './factories';
import type { signedInAgent } from './test-app';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
const DAY_MS = 86_400_000;

/** The date `days` ago, as YYYY-MM-DD (UTC). */
export function isoDaysAgo(days: number): string {
  return new Date(Date.now() - days * DAY_MS).toISOString().slice(0, 10);
}

/** The crew member of a role as a service context. */
export function contextOf(crew: CellarCrew, role: Role = 'hand'): CellarContext {
  return { cellarId: crew.cellar.id, role, userId: crew[role].id };
}

export interface BatchInVesselsOptions {
  name?: string;
  og?: number | null;
  toleranceAbv?: number;
  /** Litres in each vessel; each vessel's capacity is a little larger. */
  volumesL?: number[];
  startedDaysAgo?: number;
}

/**
 * A batch sitting in fresh vessels, with its 'started' journal entry, inserted directly
 * (the batch operations of the API are not needed to test bottling).
 */
export async function makeBatchInVessels(
  ds: DataSource,
  crew: CellarCrew,
  options: BatchInVesselsOptions = {},
): Promise<{ batch: Batch; vessels: Vessel[] }> {
  const ctx = contextOf(crew);
  const volumes = options.volumesL ?? [23];
  const startedDaysAgo = options.startedDaysAgo ?? 60;
  return ds.transaction(async (tx) => {
    const batch = await tx.getRepository(Batch).save(
      tx.getRepository(Batch).create({
        cellarId: crew.cellar.id,
        name: options.name ?? 'Test orchard melomel',
        kind: 'melomel',
        yeastName: 'Test wine yeast',
        yeastToleranceAbv: options.toleranceAbv ?? 14,
        plannedVolumeL: volumes.reduce((a, b) => a + b, 0),
        startedOn: isoDaysAgo(startedDaysAgo),
        og: options.og === undefined ? 1.1 : options.og,
        createdBy: ctx.userId,
      }),
    );
    const filledAt = new Date(Date.now() - startedDaysAgo * DAY_MS);
    const vessels: Vessel[] = [];
    for (const [i, volumeL] of volumes.entries()) {
      const repo = tx.getRepository(Vessel);
      vessels.push(
        await repo.save(
          repo.create({
            cellarId: crew.cellar.id,
            code: randomLabelCode(),
            name: `Test carboy ${i + 1}`,
            kind: 'carboy',
            material: 'glass',
            capacityL: volumeL + 0.5,
            batchId: batch.id,
            volumeL,
            filledAt,
          }),
        ),
      );
    }
    await appendEntry(
      tx,
      ctx,
      batch.id,
      {
        kind: 'started',
        volumeL: volumes.reduce((a, b) => a + b, 0),
        og: batch.og,
        vessels: vessels.map((v) => ({ vesselId: v.id, vesselName: v.name, volumeL: v.volumeL ?? 0 })),
        parents: [],
        override: null,
      },
      { occurredAt: filledAt },
    );
    return { batch, vessels };
  });
}

/** Appends gravity readings (already temperature-corrected) dated `daysAgo` days before now. */
export async function addReadings(ds: DataSource, crew: CellarCrew, batchId: string, readings: { daysAgo: number; sg: number }[]): Promise<string[]> {
  const ids: string[] = [];
  for (const r of readings) {
    const payload: JournalPayload = { kind: 'reading', sg: r.sg, temperatureC: null, calibrationC: 20, correctedSg: r.sg, ph: null, vesselId: null };
    const entry = await ds.transaction((tx) => appendEntry(tx, contextOf(crew), batchId, payload, { occurredAt: new Date(Date.now() - r.daysAgo * DAY_MS) }));
    ids.push(entry.id);
  }
  return ids;
}

/** Records an amendment that corrects fields of an earlier entry. */
export async function amendEntry(ds: DataSource, crew: CellarCrew, batchId: string, entryId: string, changes: Record<string, unknown>): Promise<void> {
  await ds.transaction((tx) =>
    appendEntry(tx, contextOf(crew), batchId, { kind: 'amendment', reason: 'misread the hydrometer', changes }, { amendsEntryId: entryId }),
  );
}

/** A rack with one shelf of `slots` slots. */
export async function makeShelf(ds: DataSource, cellarId: string, slots = 4, rackName = `Test rack ${randomLabelCode()}`): Promise<Shelf> {
  const rack = await ds.getRepository(Rack).save(ds.getRepository(Rack).create({ cellarId, name: rackName }));
  const shelf = await ds.getRepository(Shelf).save(ds.getRepository(Shelf).create({ rackId: rack.id, number: 1, slotCount: slots }));
  return shelf;
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
    bottledOn: isoDaysAgo(0),
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
