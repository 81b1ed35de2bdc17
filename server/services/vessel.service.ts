import type { DataSource, EntityManager } from 'typeorm';
import { bestVesselForRacking, headspace, rackingLoss, type RackingStage } from '../../shared/calc';
import { sanitisedUntil, vesselState } from '../../shared/domain/vessel-state';
import type { JournalPayload } from '../../shared/schemas/journal';
import type { CleaningState, Vessel as VesselDto, VesselDetail, VesselKind } from '../../shared/schemas/vessels';
import { Cellar } from '../entities/cellar.entity';
import { Vessel } from '../entities/vessel.entity';
import { ConflictError, NotFoundError } from '../errors';
import { newLabelCode } from './label-codes';
import { placeThing } from './placement.service';
import { lockVessels } from './vessel-lock';
import { findVesselRow, rackingCandidates, toVesselDtos } from './vessel-queries';

export { listVessels } from './vessel-queries';

const NO_SUCH_VESSEL = 'No such vessel in this cellar.';

/** The vessel as the API shows it, read inside the operation's transaction. */
async function vesselDto(tx: EntityManager, cellarId: string, vesselId: string, now = new Date()): Promise<VesselDto> {
  const row = await findVesselRow(tx, cellarId, vesselId, now);
  if (!row) throw new NotFoundError(NO_SUCH_VESSEL);
  const [dto] = await toVesselDtos(tx, [row], now);
  return dto;
}

/** Marks a change that touched no column of the row itself (a move): version and updated_at. */
async function bumpVersion(tx: EntityManager, vesselId: string): Promise<void> {
  await tx.query(`UPDATE vessels SET version = version + 1, updated_at = now() WHERE id = $1`, [vesselId]);
}

/** Locks one vessel for the transaction, checking the caller's version (409 naming it otherwise). */
async function lockOne(tx: EntityManager, cellarId: string, vesselId: string, expectedVersion?: number): Promise<Vessel> {
  const locked = await lockVessels(tx, cellarId, [{ vesselId, expectedVersion }]);
  return locked.get(vesselId)!;
}

async function validDays(tx: EntityManager, cellarId: string): Promise<number> {
  return (await tx.getRepository(Cellar).findOneByOrFail({ id: cellarId })).sanitisedValidDays;
}

export interface VesselCreateInput {
  name: string;
  kind: VesselKind;
  material: string;
  capacityL: number;
  state: CleaningState;
  notes: string;
}

/** A new empty vessel with a fresh label code; created sanitised, it counts from now. */
export async function createVessel(ds: DataSource, cellarId: string, input: VesselCreateInput): Promise<VesselDto> {
  return ds.transaction(async (tx) => {
    const repo = tx.getRepository(Vessel);
    const saved = await repo.save(
      repo.create({
        cellarId,
        code: await newLabelCode(tx),
        name: input.name,
        kind: input.kind,
        material: input.material,
        capacityL: input.capacityL,
        cleaningState: input.state,
        sanitisedAt: input.state === 'sanitised' ? new Date() : null,
        notes: input.notes,
      }),
    );
    return vesselDto(tx, cellarId, saved.id);
  });
}

type ReadingPayload = Extract<JournalPayload, { kind: 'reading' }> & { at?: string };

/**
 * The latest gravity reading of the batch in this vessel: readings taken of this vessel or of
 * the batch as a whole (no vessel), with any amendments applied in the order they were made.
 */
async function lastReading(tx: EntityManager, batchId: string, vesselId: string): Promise<VesselDetail['lastReading']> {
  const rows: { payload: ReadingPayload; occurredAt: Date; changes: Record<string, unknown>[] }[] = await tx.query(
    `SELECT e.payload, e.occurred_at AS "occurredAt",
            COALESCE((SELECT jsonb_agg(a.payload->'changes' ORDER BY a.recorded_at)
                        FROM journal_entries a
                       WHERE a.amends_entry_id = e.id AND a.kind = 'amendment'), '[]'::jsonb) AS changes
       FROM journal_entries e
      WHERE e.batch_id = $1 AND e.kind = 'reading'`,
    [batchId],
  );
  let latest: { sg: number; correctedSg: number; at: Date } | null = null;
  for (const row of rows) {
    const p: ReadingPayload = Object.assign({}, row.payload, ...row.changes);
    if (p.vesselId && p.vesselId !== vesselId) continue;
    const at = p.at ? new Date(p.at) : new Date(row.occurredAt);
    if (typeof p.sg !== 'number' || typeof p.correctedSg !== 'number' || Number.isNaN(at.getTime())) continue;
    if (!latest || at > latest.at) latest = { sg: p.sg, correctedSg: p.correctedSg, at };
  }
  return latest && { sg: latest.sg, correctedSg: latest.correctedSg, at: latest.at.toISOString() };
}

/** The Vessel page: the vessel, its headspace and the batch's latest reading. */
export async function getVesselDetail(ds: DataSource, cellarId: string, vesselId: string): Promise<VesselDetail> {
  const tx = ds.manager;
  const now = new Date();
  const row = await findVesselRow(tx, cellarId, vesselId, now);
  if (!row) throw new NotFoundError(NO_SUCH_VESSEL);
  const [dto] = await toVesselDtos(tx, [row], now);
  const holding = dto.state === 'holding' && row.batchId !== null && row.volumeL !== null;
  return {
    ...dto,
    headspace: holding ? headspace({ capacityL: row.capacityL, volumeL: row.volumeL! }) : null,
    batchStartedOn: row.batchId ? row.batchStartedOn : null,
    lastReading: holding ? await lastReading(tx, row.batchId!, row.id) : null,
    sanitisedUntil:
      !row.retiredAt && !row.batchId && row.cleaningState === 'sanitised' && row.sanitisedAt
        ? sanitisedUntil(row.sanitisedAt, row.sanitisedValidDays).toISOString()
        : null,
  };
}

/**
 * The best free sanitised vessel for racking `volumeL`: the smallest that holds what is left
 * after the expected loss (ties go to the first by name). Excluded ids are already chosen.
 */
export async function suggestRackTarget(
  ds: DataSource,
  cellarId: string,
  input: { volumeL: number; stage: RackingStage; exclude: string[] },
): Promise<{ suggestion: VesselDto | null; expectedLossL: number; volumeAfterLossL: number }> {
  const now = new Date();
  const candidates = await rackingCandidates(ds.manager, cellarId, input.exclude, now);
  const expectedLossL = rackingLoss({ volumeL: input.volumeL, stage: input.stage });
  const best = bestVesselForRacking({ volumeL: input.volumeL, stage: input.stage, candidates });
  return {
    suggestion: best ? await vesselDto(ds.manager, cellarId, best.id, now) : null,
    expectedLossL,
    volumeAfterLossL: input.volumeL - expectedLossL,
  };
}

export interface VesselUpdateInput {
  name?: string;
  kind?: VesselKind;
  material?: string;
  capacityL?: number;
  notes?: string;
  expectedVersion?: number;
}

/** Renames or re-describes a vessel; its capacity never below what it holds. */
export async function updateVessel(ds: DataSource, cellarId: string, vesselId: string, input: VesselUpdateInput): Promise<VesselDto> {
  return ds.transaction(async (tx) => {
    const { expectedVersion, ...changes } = input;
    const vessel = await lockOne(tx, cellarId, vesselId, expectedVersion);
    if (changes.capacityL !== undefined && vessel.volumeL !== null && changes.capacityL < vessel.volumeL) {
      throw new ConflictError(
        `${vessel.name} holds ${vessel.volumeL} L now, so its capacity cannot be less than that. Rack some out first, or check the number.`,
        { vesselId: vessel.id },
      );
    }
    const defined = Object.fromEntries(Object.entries(changes).filter(([, v]) => v !== undefined));
    await tx.getRepository(Vessel).save(Object.assign(vessel, defined));
    return vesselDto(tx, cellarId, vesselId);
  });
}

/**
 * Why a cleaning change is refused, or null when it is allowed. Only an empty vessel in use is
 * cleaned; it goes dirty → clean → sanitised (a lapsed one counts as clean, and a sanitised one
 * may be sanitised again), and anything may be marked dirty.
 */
export function cleaningRefusal(vessel: Vessel, target: CleaningState, days: number, now: Date): string | null {
  if (vessel.retiredAt) return `${vessel.name} is retired. Bring it back into use first.`;
  if (vessel.batchId) return `${vessel.name} holds a batch. Only an empty vessel is cleaned or sanitised.`;
  const current = vesselState(vessel, days, now);
  if (target === 'dirty') return null;
  if (target === 'sanitised') {
    return current === 'dirty' ? `Clean it first: ${vessel.name} is dirty, and sanitiser only works on a clean surface.` : null;
  }
  if (current === 'dirty') return null;
  if (current === 'clean') return `${vessel.name} is already clean.`;
  return `${vessel.name} is sanitised, which includes clean. To start over, mark it dirty.`;
}

/** Marks an empty vessel dirty, clean or sanitised (sanitising again refreshes the time). */
export async function setCleaning(
  ds: DataSource,
  cellarId: string,
  vesselId: string,
  input: { state: CleaningState; expectedVersion?: number },
): Promise<VesselDto> {
  return ds.transaction(async (tx) => {
    const vessel = await lockOne(tx, cellarId, vesselId, input.expectedVersion);
    const now = new Date();
    const refusal = cleaningRefusal(vessel, input.state, await validDays(tx, cellarId), now);
    if (refusal) throw new ConflictError(refusal, { vesselId: vessel.id });
    vessel.cleaningState = input.state;
    if (input.state === 'sanitised') vessel.sanitisedAt = now;
    await tx.getRepository(Vessel).save(vessel);
    return vesselDto(tx, cellarId, vesselId);
  });
}

/** Retires an empty vessel (it keeps its place) or brings one back into use, dirty. */
export async function setRetired(
  ds: DataSource,
  cellarId: string,
  vesselId: string,
  input: { retired: boolean; expectedVersion?: number },
): Promise<VesselDto> {
  return ds.transaction(async (tx) => {
    const vessel = await lockOne(tx, cellarId, vesselId, input.expectedVersion);
    if (input.retired && !vessel.retiredAt) {
      if (vessel.batchId) {
        throw new ConflictError(`${vessel.name} holds a batch. Only an empty vessel can be retired.`, { vesselId: vessel.id });
      }
      vessel.retiredAt = new Date();
      await tx.getRepository(Vessel).save(vessel);
    } else if (!input.retired && vessel.retiredAt) {
      vessel.retiredAt = null;
      vessel.cleaningState = 'dirty';
      await tx.getRepository(Vessel).save(vessel);
    }
    return vesselDto(tx, cellarId, vesselId);
  });
}

/** Puts a vessel into a slot, or takes it off its shelf when `to` is null. */
export async function moveVessel(
  ds: DataSource,
  cellarId: string,
  vesselId: string,
  input: { to: { shelfId: string; slot: number } | null; expectedVersion?: number },
): Promise<VesselDto> {
  return ds.transaction(async (tx) => {
    await lockOne(tx, cellarId, vesselId, input.expectedVersion);
    await placeThing(tx, cellarId, { vesselId }, input.to);
    await bumpVersion(tx, vesselId);
    return vesselDto(tx, cellarId, vesselId);
  });
}

/** Deletes an empty vessel and its place. The journal keeps its name where it was used. */
export async function deleteVessel(ds: DataSource, cellarId: string, vesselId: string, expectedVersion?: number): Promise<void> {
  await ds.transaction(async (tx) => {
    const vessel = await lockOne(tx, cellarId, vesselId, expectedVersion);
    if (vessel.batchId) {
      throw new ConflictError(`${vessel.name} holds a batch. Rack or bottle it out before deleting the vessel.`, { vesselId: vessel.id });
    }
    await tx.getRepository(Vessel).delete({ id: vessel.id });
  });
}
