import crypto from 'node:crypto';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { expect } from 'vitest';
import { operationResultSchema, type OperationResult } from '../../shared/schemas/batch-detail';
import type { BatchStart } from '../../shared/schemas/batches';
import type { Vessel } from '../../server/entities/vessel.entity';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from './factories';
import { agentsFor, signedInAgent } from './test-app';
import { makeVessel, type VesselSeed } from './vessel-factories';

export type Agent = Awaited<ReturnType<typeof signedInAgent>>;

/** A fresh cellar with one signed-in agent per role, so a test's lists and totals are its own. */
export interface Crew extends CellarCrew {
  as: { keeper: Agent; hand: Agent; guest: Agent };
  /** /api/cellars/:id/batches */
  batches: string;
}

export async function crewWithAgents(app: Express, ds: DataSource): Promise<Crew> {
  const crew = await makeCellarWithCrew(ds);
  return { ...crew, as: await agentsFor(app, crew, TEST_PASSWORD), batches: `/api/cellars/${crew.cellar.id}/batches` };
}

/** An empty sanitised vessel (override with seed), named uniquely. */
export function sanitisedVessel(ds: DataSource, cellarId: string, seed: VesselSeed = {}): Promise<Vessel> {
  return makeVessel(ds, cellarId, { cleaningState: 'sanitised', name: `Vessel ${crypto.randomBytes(3).toString('hex')}`, ...seed });
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

/** A batch in fresh sanitised vessels of the given fills (capacity 23 L unless given). */
export async function batchInVessels(
  ds: DataSource,
  crew: Crew,
  volumes: number[] = [20],
  overrides: Partial<BatchStart> = {},
  seed: VesselSeed = {},
): Promise<{ result: OperationResult; vessels: Vessel[] }> {
  const vessels: Vessel[] = [];
  for (const _ of volumes) vessels.push(await sanitisedVessel(ds, crew.cellar.id, seed));
  const result = await startThroughApi(crew.as.hand, crew.batches, vessels.map((vessel, i) => ({ vessel, volumeL: volumes[i] })), overrides);
  return { result, vessels };
}

/** The ISO date `days` before today (UTC). */
export function daysAgo(days: number): string {
  return new Date(Date.now() - days * 86_400_000).toISOString().slice(0, 10);
}

/** An ISO date-time `days` before now. */
export function momentDaysAgo(days: number): string {
  return new Date(Date.now() - days * 86_400_000).toISOString();
}

/** Reads a vessel row as the database has it now. */
export async function vesselRow(ds: DataSource, vesselId: string) {
  const [row] = await ds.query(
    `SELECT batch_id, volume_l::float8 AS volume_l, filled_at, cleaning_state, sanitised_at, version FROM vessels WHERE id = $1`,
    [vesselId],
  );
  return row as { batch_id: string | null; volume_l: number | null; filled_at: Date | null; cleaning_state: string; sanitised_at: Date | null; version: number };
}
