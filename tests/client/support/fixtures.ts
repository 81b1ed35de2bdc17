import type { SessionUser } from '@shared/schemas/auth';
import { batchDetailSchema, type BatchDetail, type OperationResult } from '@shared/schemas/batch-detail';
import { batchPageSchema, type BatchSummary } from '@shared/schemas/batches';
import { cellarSchema, type Cellar } from '@shared/schemas/cellars';
import { readingResultSchema, type ReadingResult } from '@shared/schemas/journal';
import type { Role } from '@shared/roles';
import { taskSchema, type Task } from '@shared/schemas/tasks';
import { vesselSchema, type Vessel } from '@shared/schemas/vessels';
import type { FakeApi } from './fake-api';

/** Invented ids and names for the client tests (no real household). */
export const CELLAR_ID = '5d1c7a52-3f0e-4b6a-9a51-1f2e3d4c5b6a';
export const BATCH_ID = '8a0b6c1d-2e3f-4a5b-8c7d-9e0f1a2b3c4d';
export const VESSEL_ID = 'c3d4e5f6-a7b8-4c9d-8e0f-1a2b3c4d5e6f';
export const ENTRY_ID = 'e1f2a3b4-c5d6-4e7f-8a9b-0c1d2e3f4a5b';

export function sessionUser(role: Role = 'hand'): SessionUser {
  return {
    id: '0f1e2d3c-4b5a-4968-8776-655443322110',
    email: 'wren@quillfield.test',
    displayName: 'Wren Quillfield',
    cellars: [{ cellarId: CELLAR_ID, cellarName: 'Quillfield cellar', role }],
  };
}

/** The fake server knows this user as signed in (the router's guard asks first). */
export function signIn(api: FakeApi, role: Role = 'hand'): void {
  api.on('GET', '/api/auth/me', { body: sessionUser(role) });
}

/** The open cellar's settings in the given units, checked against the shared schema. */
export function cellarSettings(unitSystem: Cellar['unitSystem']): Cellar {
  return cellarSchema.parse({
    id: CELLAR_ID,
    name: 'Quillfield cellar',
    unitSystem,
    timeZone: 'Europe/Berlin',
    sanitisedValidDays: 7,
    headspaceWarnPercent: 10,
    annualLimitL: null,
    publicBottleCards: false,
    role: 'hand',
  });
}

/** A batch in one 23 L carboy, checked against the shared schema so the fixture cannot drift. */
export function batchDetail(overrides: Partial<BatchDetail> = {}): BatchDetail {
  return batchDetailSchema.parse({
    id: BATCH_ID,
    name: 'Hedgerow melomel',
    kind: 'melomel',
    stage: 'primary',
    startedOn: '2026-02-01',
    og: 1.11,
    volumeL: 21,
    vesselCount: 1,
    lastReading: null,
    lastRackedAt: null,
    needsRacking: false,
    yeastToleranceAbv: 14,
    ingredients: [],
    yeastName: 'Wine yeast',
    plannedVolumeL: 21,
    targetSweetness: null,
    notes: '',
    vessels: [
      { id: VESSEL_ID, code: 'K7M2P9QX', name: 'Carboy 3', capacityL: 23, volumeL: 21, filledAt: '2026-02-01T10:00:00Z', place: null, version: 4 },
    ],
    readings: [],
    journal: [],
    parents: [],
    children: [],
    lots: [],
    additionsIn: [],
    ...overrides,
  });
}

export function operationResult(warnings: string[] = [], batch: BatchDetail = batchDetail()): OperationResult {
  return { batch, entryId: ENTRY_ID, warnings };
}

/** What logging a reading answers: the reading and the stage. */
export function readingResult(warnings: string[] = []): ReadingResult {
  return readingResultSchema.parse({
    entryId: ENTRY_ID,
    reading: { entryId: ENTRY_ID, at: '2026-02-21T09:00:00.000Z', sg: 1.05, correctedSg: 1.05, temperatureC: null, ph: null },
    stage: 'primary',
    warnings,
  });
}

export function batchSummary(overrides: Partial<BatchSummary> = {}): BatchSummary {
  const { id, name, kind, stage, startedOn, og, volumeL, vesselCount, lastReading, lastRackedAt, needsRacking, yeastToleranceAbv } = batchDetail();
  return { id, name, kind, stage, startedOn, og, volumeL, vesselCount, lastReading, lastRackedAt, needsRacking, yeastToleranceAbv, ...overrides };
}

export function batchPage(items: BatchSummary[] = [batchSummary()]) {
  return batchPageSchema.parse({ items, total: items.length, page: 1, pageSize: 25 });
}

/** A 30 L bucket holding 20 L of the test batch, checked against the shared schema. */
export function vessel(overrides: Partial<Vessel> = {}): Vessel {
  return vesselSchema.parse({
    id: VESSEL_ID,
    code: 'ABCDEFGH',
    name: 'Fermenter 1',
    kind: 'bucket',
    material: 'plastic',
    capacityL: 30,
    state: 'holding',
    sanitisedAt: null,
    batch: { id: BATCH_ID, name: 'Test melomel', kind: 'melomel' },
    volumeL: 20,
    filledAt: '2026-11-01T12:00:00.000Z',
    place: null,
    notes: '',
    version: 1,
    ...overrides,
  });
}

/**
 * An open planned task of the test batch as the server lists it for `today`, checked against the shared schema.
 * @param occurrence - makes the key unique when one rule gives several
 */
export function plannedTask(ruleId: string, title: string, dueOn: string, today: string, occurrence = 'primary.0'): Task {
  return taskSchema.parse({
    key: `${BATCH_ID}/${ruleId}/${occurrence}`,
    batch: { id: BATCH_ID, name: 'Test melomel', kind: 'melomel', stage: 'primary' },
    vesselNames: ['Fermenter 1'],
    what: 'reading',
    title,
    dueOn,
    showFrom: dueOn,
    rule: { id: ruleId, note: 'Common practice: weekly in primary.' },
    reason: 'every week while in primary',
    status: 'open',
    bucket: dueOn < today ? 'overdue' : dueOn === today ? 'today' : 'upcoming',
    snoozedUntil: null,
    closed: null,
  });
}
