import crypto from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { expect } from 'vitest';
import { operationResultSchema, type OperationResult } from '../../shared/schemas/batch-detail';
import type { BatchStart } from '../../shared/schemas/batches';
import { Batch } from '../../server/entities/batch.entity';
import type { Vessel } from '../../server/entities/vessel.entity';
import { appendEntry } from '../../server/journal/journal';
import { randomLabelCode } from '../../server/labels/label-codes';
import { contextOf, type Agent, type CellarCrew, type Crew } from './crew';
import { daysAgo } from './dates';
import { makeVessel, sanitisedVessel, type VesselSeed } from './vessels';

/**
 * Batches: written straight into the database (`makeBatch`, `makeBatchInVessels`) where a
 * test is not about starting one, or started through the API (`startThroughApi`,
 * `batchInVessels`) where it is. Invented data only.
 */

const DAY_MS = 86_400_000;

export type BatchSeed = Partial<
  Pick<Batch, 'name' | 'kind' | 'startedOn' | 'og' | 'lastReadingSg' | 'yeastName' | 'yeastToleranceAbv' | 'plannedVolumeL' | 'createdBy'>
>;

/**
 * A batch row and nothing else (no journal, no vessels): a melomel of 20 L started on
 * 2026-01-10 with an unknown OG unless told otherwise.
 * @param db - the data source, or the transaction that also writes its vessels
 */
export async function makeBatch(db: DataSource | EntityManager, cellarId: string, seed: BatchSeed = {}): Promise<Batch> {
  const repo = db.getRepository(Batch);
  return repo.save(
    repo.create({
      cellarId,
      name: seed.name ?? `Batch ${randomLabelCode()}`,
      kind: seed.kind ?? 'melomel',
      ingredients: [],
      yeastName: seed.yeastName ?? 'Test yeast',
      yeastToleranceAbv: seed.yeastToleranceAbv ?? 14,
      plannedVolumeL: seed.plannedVolumeL ?? 20,
      startedOn: seed.startedOn ?? '2026-01-10',
      og: seed.og ?? null,
      lastReadingSg: seed.lastReadingSg ?? null,
      lastReadingAt: seed.lastReadingSg ? new Date() : null,
      createdBy: seed.createdBy ?? null,
    }),
  );
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
 * (for tests of what follows a start, which do not need the start operation of the API).
 */
export async function makeBatchInVessels(
  ds: DataSource,
  crew: CellarCrew,
  options: BatchInVesselsOptions = {},
): Promise<{ batch: Batch; vessels: Vessel[] }> {
  const ctx = contextOf(crew);
  const volumes = options.volumesL ?? [23];
  const totalL = volumes.reduce((a, b) => a + b, 0);
  const startedDaysAgo = options.startedDaysAgo ?? 60;
  return ds.transaction(async (tx) => {
    const batch = await makeBatch(tx, crew.cellar.id, {
      name: options.name ?? 'Test orchard melomel',
      kind: 'melomel',
      yeastName: 'Test wine yeast',
      yeastToleranceAbv: options.toleranceAbv ?? 14,
      plannedVolumeL: totalL,
      startedOn: daysAgo(startedDaysAgo),
      og: options.og === undefined ? 1.1 : options.og,
      createdBy: ctx.userId,
    });
    const filledAt = new Date(Date.now() - startedDaysAgo * DAY_MS);
    const vessels: Vessel[] = [];
    for (const [i, volumeL] of volumes.entries()) {
      vessels.push(await makeVessel(tx, crew.cellar.id, { name: `Test carboy ${i + 1}`, capacityL: volumeL + 0.5, batch, volumeL, filledAt }));
    }
    await appendEntry(
      tx,
      ctx,
      batch.id,
      {
        kind: 'started',
        volumeL: totalL,
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

/** A valid start request (invented melomel) for the given fills. */
export function startRequest(fills: { vessel: { id: string }; volumeL: number }[], overrides: Partial<BatchStart> = {}): BatchStart {
  return {
    name: `Bramble melomel ${crypto.randomBytes(2).toString('hex')}`,
    kind: 'melomel',
    ingredients: [{ category: 'honey', name: 'Wildflower honey', amount: 6, unit: 'kg' }],
    yeast: { name: 'Test wine yeast', toleranceAbv: 14 },
    plannedVolumeL: fills.reduce((sum, f) => sum + f.volumeL, 0),
    startedOn: new Date().toISOString().slice(0, 10),
    og: 1.11,
    vessels: fills.map((f) => ({ vesselId: f.vessel.id, volumeL: f.volumeL })),
    ...overrides,
  };
}

/** Starts a batch through the API and checks the answer against the contract. */
export async function startThroughApi(
  agent: Agent,
  batchesUrl: string,
  fills: { vessel: { id: string }; volumeL: number }[],
  overrides: Partial<BatchStart> = {},
): Promise<OperationResult> {
  const res = await agent.post(batchesUrl).send(startRequest(fills, overrides));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return operationResultSchema.parse(res.body);
}

/** A batch started through the API (by the Hand) in fresh sanitised vessels of the given fills (capacity 23 L unless given). */
export async function batchInVessels(
  ds: DataSource,
  crew: Crew,
  volumes: number[] = [20],
  overrides: Partial<BatchStart> = {},
  seed: VesselSeed = {},
): Promise<{ result: OperationResult; vessels: Vessel[] }> {
  const vessels: Vessel[] = [];
  for (const _ of volumes) vessels.push(await sanitisedVessel(ds, crew.cellar.id, seed));
  const result = await startThroughApi(
    crew.as.hand,
    crew.batches,
    vessels.map((vessel, i) => ({ vessel, volumeL: volumes[i] })),
    overrides,
  );
  return { result, vessels };
}
