import type { EntityManager } from 'typeorm';
import { bestVesselForRacking, headspace, rackingLoss, type RackingStage } from '../../shared/calc';
import { sanitisedUntil } from '../../shared/domain/vessel-state';
import type { CleaningState, Vessel as VesselDto, VesselDetail, VesselKind } from '../../shared/schemas/vessels';
import { recordAudit } from '../audit/audit-log';
import { moveSummary } from '../audit/move-summary';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { volumeText } from '../core/litres';
import { Vessel } from '../entities/vessel.entity';
import { ConflictError, NotFoundError } from '../http/errors';
import { lastVesselReading } from '../journal/journal-queries';
import { newLabelCode } from '../labels/label-codes';
import { placeThing } from '../places/placement';
import { cleaningRefusal } from './cleaning-rules';
import { lockVessels } from './vessel-lock';
import { requireFreeVesselName } from './vessel-names';
import { findVesselPage, findVesselRow, rackingCandidates, toVesselDtos } from './vessel-queries';

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
async function lockOne(tx: EntityManager, actor: Actor, vesselId: string, expectedVersion?: number): Promise<Vessel> {
  const locked = await lockVessels(tx, actor, [{ vesselId, expectedVersion }]);
  return locked.get(vesselId)!;
}

async function validDays(tx: EntityManager, cellarId: string): Promise<number> {
  return (await loadCellar(tx, cellarId)).sanitisedValidDays;
}

/** A page of the cellar's vessels, filtered and sorted in SQL. */
export function listVessels(actor: Actor, tx: EntityManager, query: Parameters<typeof findVesselPage>[2]): ReturnType<typeof findVesselPage> {
  requireRole(actor, 'guest');
  return findVesselPage(tx, actor.cellarId, query);
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
export async function createVessel(actor: Actor, tx: EntityManager, input: VesselCreateInput): Promise<VesselDto> {
  requireRole(actor, 'hand');
  const { cellarId } = actor;
  await requireFreeVesselName(tx, cellarId, input.name);
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
  await recordAudit(tx, actor, { kind: 'vessel', action: 'added', vesselId: saved.id, summary: `Added ${saved.name} (${saved.capacityL} L)` });
  return vesselDto(tx, cellarId, saved.id);
}

/** The batch's latest reading taken in this vessel or for the whole batch. */
async function lastReading(tx: EntityManager, batchId: string, vesselId: string): Promise<VesselDetail['lastReading']> {
  const latest = await lastVesselReading(tx, batchId, vesselId);
  return latest && { sg: latest.sg, correctedSg: latest.correctedSg, at: latest.at };
}

/** The Vessel page: the vessel, its headspace and the batch's latest reading. */
export async function getVesselDetail(actor: Actor, tx: EntityManager, vesselId: string): Promise<VesselDetail> {
  requireRole(actor, 'guest');
  const { cellarId } = actor;
  const now = new Date();
  const row = await findVesselRow(tx, cellarId, vesselId, now);
  if (!row) throw new NotFoundError(NO_SUCH_VESSEL);
  const [dto] = await toVesselDtos(tx, [row], now);
  const holding = dto.state === 'holding' && row.batchId !== null && row.volumeL !== null;
  return {
    ...dto,
    headspace: holding ? headspace({ capacityL: row.capacityL, volumeL: row.volumeL! }) : null,
    batchStartedOn: row.batchId ? row.batchStartedOn : null,
    batchOg: row.batchId ? (row.batchOg ?? null) : null,
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
  actor: Actor,
  tx: EntityManager,
  input: { volumeL: number; stage: RackingStage; exclude: string[] },
): Promise<{ suggestion: VesselDto | null; expectedLossL: number; volumeAfterLossL: number }> {
  requireRole(actor, 'guest');
  const { cellarId } = actor;
  const now = new Date();
  const candidates = await rackingCandidates(tx, cellarId, input.exclude, now);
  const expectedLossL = rackingLoss({ volumeL: input.volumeL, stage: input.stage });
  const best = bestVesselForRacking({ volumeL: input.volumeL, stage: input.stage, candidates });
  return {
    suggestion: best ? await vesselDto(tx, cellarId, best.id, now) : null,
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
export async function updateVessel(actor: Actor, tx: EntityManager, vesselId: string, input: VesselUpdateInput): Promise<VesselDto> {
  requireRole(actor, 'hand');
  const { cellarId } = actor;
  const { expectedVersion, ...changes } = input;
  const vessel = await lockOne(tx, actor, vesselId, expectedVersion);
  if (changes.name !== undefined) await requireFreeVesselName(tx, cellarId, changes.name, vessel.id);
  if (changes.capacityL !== undefined && vessel.volumeL !== null && changes.capacityL < vessel.volumeL) {
    throw new ConflictError(
      `${vessel.name} holds ${volumeText(vessel.volumeL, actor.units)} now, so its capacity cannot be less than that. Rack some out first, or check the number.`,
      { vesselId: vessel.id },
    );
  }
  const defined = Object.fromEntries(Object.entries(changes).filter(([, v]) => v !== undefined));
  await tx.getRepository(Vessel).save(Object.assign(vessel, defined));
  await recordAudit(tx, actor, {
    kind: 'vessel',
    action: 'edited',
    vesselId,
    summary: `Changed ${Object.keys(defined).join(', ')} of ${vessel.name}`,
  });
  return vesselDto(tx, cellarId, vesselId);
}

/** Marks an empty vessel dirty, clean or sanitised (sanitising again refreshes the time). */
export async function setCleaning(
  actor: Actor,
  tx: EntityManager,
  vesselId: string,
  input: { state: CleaningState; expectedVersion?: number },
): Promise<VesselDto> {
  requireRole(actor, 'hand');
  const { cellarId } = actor;
  const vessel = await lockOne(tx, actor, vesselId, input.expectedVersion);
  const now = new Date();
  const refusal = cleaningRefusal(vessel, input.state, await validDays(tx, cellarId), now);
  if (refusal) throw new ConflictError(refusal, { vesselId: vessel.id });
  vessel.cleaningState = input.state;
  if (input.state === 'sanitised') vessel.sanitisedAt = now;
  await tx.getRepository(Vessel).save(vessel);
  await recordAudit(tx, actor, { kind: 'vessel', action: `marked ${input.state}`, vesselId, summary: `Marked ${vessel.name} ${input.state}` });
  return vesselDto(tx, cellarId, vesselId);
}

/** Retires an empty vessel (it keeps its place) or brings one back into use, dirty. */
export async function setRetired(
  actor: Actor,
  tx: EntityManager,
  vesselId: string,
  input: { retired: boolean; expectedVersion?: number },
): Promise<VesselDto> {
  requireRole(actor, 'hand');
  const { cellarId } = actor;
  const vessel = await lockOne(tx, actor, vesselId, input.expectedVersion);
  if (input.retired && !vessel.retiredAt) {
    if (vessel.batchId) {
      throw new ConflictError(`${vessel.name} holds a batch. Only an empty vessel can be retired.`, { vesselId: vessel.id });
    }
    vessel.retiredAt = new Date();
    await tx.getRepository(Vessel).save(vessel);
    await recordAudit(tx, actor, { kind: 'vessel', action: 'retired', vesselId, summary: `Retired ${vessel.name}` });
  } else if (!input.retired && vessel.retiredAt) {
    vessel.retiredAt = null;
    vessel.cleaningState = 'dirty';
    await tx.getRepository(Vessel).save(vessel);
    await recordAudit(tx, actor, { kind: 'vessel', action: 'back in use', vesselId, summary: `Brought ${vessel.name} back into use` });
  }
  return vesselDto(tx, cellarId, vesselId);
}

/** Puts a vessel into a slot, or takes it off its shelf when `to` is null. */
export async function moveVessel(
  actor: Actor,
  tx: EntityManager,
  vesselId: string,
  input: { to: { shelfId: string; slot: number } | null; expectedVersion?: number },
): Promise<VesselDto> {
  requireRole(actor, 'hand');
  const { cellarId } = actor;
  const vessel = await lockOne(tx, actor, vesselId, input.expectedVersion);
  await placeThing(tx, cellarId, { vesselId }, input.to);
  await bumpVersion(tx, vesselId);
  await recordAudit(tx, actor, {
    kind: 'vessel',
    action: input.to ? 'moved' : 'taken off its shelf',
    vesselId,
    summary: await moveSummary(tx, vessel.name, input.to),
  });
  return vesselDto(tx, cellarId, vesselId);
}

/** Deletes an empty vessel and its place. The journal keeps its name where it was used. */
export async function deleteVessel(actor: Actor, tx: EntityManager, vesselId: string, expectedVersion?: number): Promise<void> {
  requireRole(actor, 'keeper');
  const vessel = await lockOne(tx, actor, vesselId, expectedVersion);
  if (vessel.batchId) {
    throw new ConflictError(`${vessel.name} holds a batch. Rack or bottle it out before deleting the vessel.`, { vesselId: vessel.id });
  }
  await tx.getRepository(Vessel).delete({ id: vessel.id });
  await recordAudit(tx, actor, { kind: 'vessel', action: 'deleted', vesselId, summary: `Deleted ${vessel.name} (${vessel.code})` });
}
