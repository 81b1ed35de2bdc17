/// <reference types="vite/client" />
import { PassThrough } from 'node:stream';
import type { EntityManager } from 'typeorm';
import { beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { batchStartSchema, batchUpdateSchema } from '../../shared/schemas/batches';
import { drawDownRequestSchema } from '../../shared/schemas/bottles';
import { importOptionsSchema, readingImportQuerySchema } from '../../shared/schemas/exchange';
import {
  additionRequestSchema,
  amendRequestSchema,
  blendRequestSchema,
  bottleRequestSchema,
  degasRequestSchema,
  noteRequestSchema,
  rackRequestSchema,
  readingRequestSchema,
  removalRequestSchema,
  splitRequestSchema,
  tasteRequestSchema,
  topUpRequestSchema,
} from '../../shared/schemas/journal';
import { moveSchema, rackCreateSchema, rackUpdateSchema } from '../../shared/schemas/places';
import { vesselCleaningSchema, vesselCreateSchema, vesselRetireSchema, vesselUpdateSchema } from '../../shared/schemas/vessels';
import { writeArchive } from '../../server/archive/archive-writer';
import type { Actor } from '../../server/core/actor';
import { AppError, ForbiddenError } from '../../server/http/errors';
import type { CheckedPhoto } from '../../server/photos/photo-check';
import { makeBatch, makeBatchInVessels } from '../helpers/batches';
import { makeLotWithCases } from '../helpers/bottles';
import { contextOf, makeCellarWithCrew, type CellarCrew } from '../helpers/crew';
import { addJournalEntry, reading } from '../helpers/journal';
import { makeRack } from '../helpers/places';
import { testDataSource } from '../helpers/test-app';
import { ensureDefaultPlans, plansOf } from '../../server/plans/plan-queries';
import { planWriteSchema, type PlanRuleInput } from '../../shared/schemas/plans';
import { oneOffTaskRequestSchema } from '../../shared/schemas/tasks';
import { sanitisedVessel } from '../helpers/vessels';
import { emptyVesselRequestSchema } from '../../shared/schemas/vessel-emptying';
import { deviceCreateSchema, deviceReadingSchema } from '../../shared/schemas/devices';

/**
 * The inner door. Every function a `server/<aggregate>/*.service.ts` module exports is a
 * service: it takes the actor first and checks it before anything else. This file finds them
 * all by itself, so a new service is covered the moment it exists — and fails here until it is
 * listed below as a read or a write with the arguments to try.
 */
const modules = import.meta.glob<Record<string, unknown>>('../../server/*/*.service.ts', { eager: true });

type Service = (actor: Actor, tx: EntityManager, ...args: unknown[]) => Promise<unknown>;
const services = Object.entries(modules).flatMap(([file, exports]) =>
  Object.entries(exports)
    .filter(([, value]) => typeof value === 'function')
    .map(([name, value]) => ({ file: file.replace('../../', ''), name, fn: value as Service })),
);

/** Reads: any member may call them. */
const READS = new Set([
  'listBatches',
  'getBatch',
  'batchFamily',
  'getCase',
  'listLots',
  'getLot',
  'getCellar',
  'listMembers',
  'labelItemsFor',
  'labelChoices',
  'printLabels',
  'getVesselDetail',
  'suggestRackTarget',
  'listVessels',
  'listRacks',
  'getToday',
  'shelfDirectory',
  'shelfContents',
  'checkShelf',
  'readPhoto',
  // Tasks and plans (server/tasks, server/plans); a calendar feed is a member's own, any member turns theirs on or off.
  'listTasks',
  'tasksDue',
  'listPlans',
  'getBatchPlan',
  'getCalendarFeed',
  'turnOnCalendarFeed',
  'turnOffCalendarFeed',
  // CSV exports (server/exchange): any member may download what they can read.
  'exportBatches',
  'exportVessels',
  'exportLots',
  'exportCases',
  'exportDepartures',
  'exportJournal',
  'exportReadings',
  // The audit trail reads, but only for Keepers (tests/api/audit.test.ts checks the refusals).
  'listAudit',
  // The whole-cellar archive download: Keepers only (tests/api/archive.test.ts).
  'exportArchive',
  'listInvitations',
  'getMailStatus',
  'listOutgoingMail',
  'getMyMailSettings',
  // A write every member, Guests too, may make: it changes only the caller's own e-mail settings.
  'setMyMailSettings',
  // Digital hydrometers (server/devices): the list is Keepers' only, the chart series any member's.
  'listDevices',
  'getDeviceSeries',
]);

/** What a write is tried with: a victim cellar's things, as the service's caller would pass them. */
interface Victim {
  batchId: string;
  unusedBatchId: string;
  heldVesselId: string;
  /** A vessel of another batch of the victim's, for a blend. */
  otherHeldVesselId: string;
  emptyVesselId: string;
  readingEntryId: string;
  oakEntryId: string;
  caseId: string;
  rackId: string;
  shelfId: string;
  memberId: string;
  /** The take-out task of the victim batch's oak. */
  taskKey: string;
  planId: string;
  /** A waiting invitation to the victim cellar. */
  invitationId: string;
  /** A message of the victim cellar that failed to send. */
  failedMailId: string;
  /** A hydrometer in the victim batch's held vessel. */
  deviceId: string;
}

const testRule: PlanRuleInput = {
  id: 'r',
  what: 'reading',
  when: { type: 'after', anchor: 'start', after: { count: 7, unit: 'days' } },
  showDaysAhead: 1,
};

const parse = <S extends z.ZodType>(schema: S, value: z.input<S>): z.output<S> => schema.parse(value);

/**
 * Each write with arguments that would succeed for the victim's own Keeper. `ownCellarOnly`
 * marks writes that name nothing of another cellar (they act on the actor's own cellar).
 */
const WRITES: Record<string, { args: (v: Victim) => unknown[]; ownCellarOnly?: true }> = {
  startBatch: {
    args: (v) => [
      parse(batchStartSchema, {
        name: 'Test mead',
        kind: 'traditional-mead',
        yeast: { name: 'Test yeast', toleranceAbv: 14 },
        plannedVolumeL: 5,
        startedOn: '2026-01-01',
        vessels: [{ vesselId: v.emptyVesselId, volumeL: 5 }],
      }),
    ],
  },
  blendBatches: {
    args: (v) => [
      parse(blendRequestSchema, {
        from: [{ vesselId: v.heldVesselId }, { vesselId: v.otherHeldVesselId }],
        to: [{ vesselId: v.emptyVesselId, volumeL: 12 }],
        name: 'Test blend',
        kind: 'melomel',
      }),
    ],
  },
  updateBatch: { args: (v) => [v.batchId, parse(batchUpdateSchema, { name: 'Renamed' })] },
  deleteBatch: { args: (v) => [v.unusedBatchId] },
  addReading: { args: (v) => [v.batchId, parse(readingRequestSchema, { sg: 1.05 })] },
  rackBatch: {
    args: (v) => [v.batchId, parse(rackRequestSchema, { from: [{ vesselId: v.heldVesselId }], to: [{ vesselId: v.emptyVesselId, volumeL: 5 }] })],
  },
  splitBatch: {
    args: (v) => [v.batchId, parse(splitRequestSchema, { vessels: [{ vesselId: v.heldVesselId }], name: 'Test split', kind: 'melomel' })],
  },
  addAddition: { args: (v) => [v.batchId, parse(additionRequestSchema, { category: 'oak', name: 'Oak cubes', amount: 10, unit: 'g' })] },
  removeAddition: { args: (v) => [v.batchId, parse(removalRequestSchema, { additionEntryId: v.oakEntryId })] },
  topUp: { args: (v) => [v.batchId, parse(topUpRequestSchema, { vesselId: v.heldVesselId, volumeL: 0.1, with: 'water' })] },
  degas: { args: (v) => [v.batchId, parse(degasRequestSchema, {})] },
  taste: { args: (v) => [v.batchId, parse(tasteRequestSchema, { aroma: 'honey' })] },
  addNote: { args: (v) => [v.batchId, parse(noteRequestSchema, { text: 'A note' })] },
  amendEntry: { args: (v) => [v.batchId, v.readingEntryId, parse(amendRequestSchema, { reason: 'misread', changes: { sg: 1.04 } })] },
  bottleBatch: {
    args: (v) => [
      v.batchId,
      parse(bottleRequestSchema, {
        from: [{ vesselId: v.heldVesselId }],
        bottleMl: 750,
        bottleCount: 1,
        closure: 'cork',
        carbonation: 'still',
        sulfiteAdded: false,
        bottledOn: new Date().toISOString().slice(0, 10),
        confirmNotFinished: true,
      }),
    ],
  },
  drawDown: { args: (v) => [v.caseId, parse(drawDownRequestSchema, { count: 1, reason: 'drunk' })] },
  moveCase: { args: (v) => [v.caseId, parse(moveSchema, { to: { shelfId: v.shelfId, slot: 1 } })] },
  updateCellar: { args: () => [{ name: 'Renamed cellar' }], ownCellarOnly: true },
  inviteMember: { args: () => ['invited.newcomer@example.test', 'guest', 'http://127.0.0.1:8460'], ownCellarOnly: true },
  resendInvitation: { args: (v) => [v.invitationId, 'http://127.0.0.1:8460'] },
  revokeInvitation: { args: (v) => [v.invitationId] },
  retryMail: { args: (v) => [v.failedMailId] },
  changeMember: { args: (v) => [v.memberId, { role: 'guest' }] },
  createVessel: {
    args: () => [parse(vesselCreateSchema, { name: 'Test jug', kind: 'jug', material: 'glass', capacityL: 4.5 })],
    ownCellarOnly: true,
  },
  updateVessel: { args: (v) => [v.emptyVesselId, parse(vesselUpdateSchema, { name: 'Renamed jug' })] },
  setCleaning: { args: (v) => [v.emptyVesselId, parse(vesselCleaningSchema, { state: 'dirty' })] },
  setRetired: { args: (v) => [v.emptyVesselId, parse(vesselRetireSchema, { retired: true })] },
  moveVessel: { args: (v) => [v.emptyVesselId, parse(moveSchema, { to: { shelfId: v.shelfId, slot: 2 } })] },
  emptyVessel: { args: (v) => [v.heldVesselId, parse(emptyVesselRequestSchema, { reason: 'spoiled' })] },
  deleteVessel: { args: (v) => [v.emptyVesselId] },
  createRack: { args: () => [parse(rackCreateSchema, { name: 'Test rack', shelves: [4] })], ownCellarOnly: true },
  updateRack: { args: (v) => [v.rackId, parse(rackUpdateSchema, { name: 'Renamed rack' })] },
  deleteRack: { args: (v) => [v.rackId] },
  markTaskDone: { args: (v) => [v.taskKey] },
  snoozeTask: { args: (v) => [v.taskKey, '2099-01-01'] },
  dismissTask: { args: (v) => [v.taskKey, 'not needed'] },
  reopenTask: { args: (v) => [v.taskKey] },
  addOneOffTask: { args: (v) => [parse(oneOffTaskRequestSchema, { batchId: v.batchId, title: 'Order corks', dueOn: '2027-01-01' })] },
  createPlan: { args: () => [parse(planWriteSchema, { name: 'Test plan', rules: [testRule] })], ownCellarOnly: true },
  updatePlan: { args: (v) => [v.planId, parse(planWriteSchema, { name: 'Renamed plan', rules: [testRule] })] },
  deletePlan: { args: (v) => [v.planId] },
  assignPlan: { args: (v) => [v.batchId, v.planId] },
  // CSV imports (server/exchange): Keeper work; the upload is any async iterable of chunks.
  previewImport: { args: () => ['readings', [Buffer.from('at,sg\n2026-01-02,1.050\n')]], ownCellarOnly: true },
  importReadings: {
    args: (v) => [
      parse(readingImportQuerySchema, { batchId: v.batchId, columns: JSON.stringify({ at: 'at', sg: 'sg' }) }),
      [Buffer.from(`at,sg\n${new Date(Date.now() - 86_400_000).toISOString()},1.050\n`)],
    ],
  },
  importVessels: {
    args: () => [
      parse(importOptionsSchema, { columns: JSON.stringify({ name: 'name', capacity: 'capacity' }) }),
      [Buffer.from('name,capacity\nJug,4.5\n')],
    ],
    ownCellarOnly: true,
  },
  // A restore makes a new cellar from an archive of the victim's own (the upload streams lazily).
  restoreCellar: { args: () => [archiveOf(victim.cellar.id)], ownCellarOnly: true },
  createDevice: { args: (v) => [parse(deviceCreateSchema, { name: 'Test hydrometer', vesselId: v.heldVesselId })] },
  moveDevice: { args: (v) => [v.deviceId, { vesselId: v.otherHeldVesselId }] },
  revokeDevice: { args: (v) => [v.deviceId] },
  // A device posts as the cellar's own device job; here the same service is called as each actor.
  recordDeviceReading: { args: (v) => [v.deviceId, parse(deviceReadingSchema, { sg: 1.05 })] },
  addPhoto: {
    args: (v) => [v.batchId, { mimeType: 'image/png', stored: Buffer.from([1]), thumbnail: Buffer.from([1]) } as unknown as CheckedPhoto, 'caption'],
  },
};

let ds: Awaited<ReturnType<typeof testDataSource>>;

/** A cellar's archive as upload chunks, written only when a restore starts reading it. */
async function* archiveOf(cellarId: string): AsyncGenerator<Buffer> {
  const out = new PassThrough();
  const written = ds.transaction('REPEATABLE READ', (tx) => writeArchive(tx, cellarId, out));
  for await (const chunk of out) yield chunk as Buffer;
  await written;
}
let victim: CellarCrew;
let stranger: CellarCrew;
let v: Victim;

beforeAll(async () => {
  ds = await testDataSource();
  [victim, stranger] = await Promise.all([makeCellarWithCrew(ds), makeCellarWithCrew(ds)]);
  const { batch, vessels } = await makeBatchInVessels(ds, victim, { volumesL: [10, 10] });
  const bottled = await makeBatchInVessels(ds, victim, { volumesL: [5] });
  const { cases } = await makeLotWithCases(ds, victim.cellar.id, bottled.batch);
  const unused = await makeBatch(ds, victim.cellar.id, { name: 'Never started' });
  const rack = await makeRack(ds, victim.cellar.id, 'Victim rack', [4]);
  const empty = await sanitisedVessel(ds, victim.cellar.id, { capacityL: 12 });
  const readingEntryId = await addJournalEntry(ds, victim.cellar.id, batch.id, reading(1.05, null));
  const oakEntryId = await addJournalEntry(ds, victim.cellar.id, batch.id, {
    kind: 'addition',
    category: 'oak',
    name: 'Oak spiral',
    amount: 1,
    unit: 'pc',
    vesselId: null,
    removeOn: '2027-01-01',
  });
  const [member]: { id: string }[] = await ds.query(`SELECT id FROM memberships WHERE cellar_id = $1 AND user_id = $2`, [
    victim.cellar.id,
    victim.hand.id,
  ]);
  v = {
    batchId: batch.id,
    unusedBatchId: unused.id,
    heldVesselId: vessels[1].id,
    otherHeldVesselId: bottled.vessels[0].id,
    emptyVesselId: empty.id,
    readingEntryId,
    oakEntryId,
    caseId: cases[0].id,
    rackId: rack.id,
    shelfId: rack.shelfIds[0],
    memberId: member.id,
    taskKey: `${batch.id}/oak-out/${oakEntryId}`,
    planId: await ds.transaction(async (tx) => {
      await ensureDefaultPlans(tx, victim.cellar.id);
      return (await plansOf(tx, victim.cellar.id))[0]!.id;
    }),
    ...(await victimMail(ds, victim)),
    deviceId: (
      await ds.query(
        `INSERT INTO devices (cellar_id, vessel_id, name, token_hash, token_end) VALUES ($1, $2, 'Victim hydrometer', sha256('victim'::bytea), 'tim1') RETURNING id`,
        [victim.cellar.id, vessels[1].id],
      )
    )[0].id as string,
  };
});

/** Runs a service in a transaction that is always rolled back; what it threw, or 'succeeded'. */
async function attempt(fn: (tx: EntityManager) => Promise<unknown>): Promise<unknown> {
  const rollback = new Error('rollback');
  try {
    await ds.transaction(async (tx) => {
      await fn(tx);
      throw rollback;
    });
  } catch (error) {
    return error === rollback ? 'succeeded' : error;
  }
  return 'succeeded';
}

describe('every service checks its actor (the inner door)', () => {
  it('finds the services, and each one is listed as a read or a write', () => {
    expect(services.length).toBeGreaterThan(40);
    const unlisted = services.filter((s) => !READS.has(s.name) && !(s.name in WRITES)).map((s) => `${s.file}: ${s.name}`);
    expect(unlisted, 'list each new service in READS or WRITES of this file').toEqual([]);
    const takesNoActor = services
      .filter((s) => !/^(async\s+)?function\s*\w*\s*\(\s*actor\b/.test(s.fn.toString()))
      .map((s) => `${s.file}: ${s.name}`);
    expect(takesNoActor, 'a *.service.ts module exports only services, each taking (actor, tx, …)').toEqual([]);
  });

  it("lets the victim cellar's own Keeper do every write with these arguments (so the refusals below are about the actor)", async () => {
    const keeper = contextOf(victim, 'keeper');
    for (const [name, write] of Object.entries(WRITES)) {
      const service = services.find((s) => s.name === name);
      const outcome = await attempt((tx) => service!.fn(keeper, tx, ...write.args(v)));
      expect([name, outcome instanceof Error ? outcome.message : outcome]).toEqual([name, 'succeeded']);
    }
  });

  it('refuses every write to a Guest, before touching anything', async () => {
    const guest = contextOf(victim, 'guest');
    const writes = services.filter((s) => s.name in WRITES);
    expect(writes.length).toBe(Object.keys(WRITES).length);
    for (const s of writes) {
      const outcome = await attempt((tx) => s.fn(guest, tx, ...WRITES[s.name].args(v)));
      expect([s.name, outcome instanceof ForbiddenError]).toEqual([s.name, true]);
    }
  });

  it("refuses every write naming another cellar's things to that other cellar's Keeper, and changes nothing", async () => {
    const outsider = contextOf(stranger, 'keeper');
    const before = await ds.query(`SELECT count(*)::int AS n FROM journal_entries WHERE cellar_id = $1`, [victim.cellar.id]);
    for (const s of services.filter((x) => x.name in WRITES && !WRITES[x.name].ownCellarOnly)) {
      const outcome = await attempt((tx) => s.fn(outsider, tx, ...WRITES[s.name].args(v)));
      expect([s.name, outcome instanceof AppError && outcome.status < 500]).toEqual([s.name, true]);
    }
    expect(await ds.query(`SELECT count(*)::int AS n FROM journal_entries WHERE cellar_id = $1`, [victim.cellar.id])).toEqual(before);
  });

  it('lets a Guest read', async () => {
    const guest = contextOf(victim, 'guest');
    const getBatch = services.find((s) => s.name === 'getBatch')!;
    expect(await attempt((tx) => getBatch.fn(guest, tx, v.batchId))).toBe('succeeded');
  });
});

/** A waiting invitation and a failed message in the victim cellar, written as the app would leave them. */
async function victimMail(ds: Awaited<ReturnType<typeof testDataSource>>, crew: CellarCrew) {
  const [invitation]: { id: string }[] = await ds.query(
    `INSERT INTO invitations (cellar_id, email, role, token_hash, invited_by, expires_at)
     VALUES ($1, 'waiting.invitee@example.test', 'hand', repeat('a', 64), $2, now() + interval '7 days') RETURNING id`,
    [crew.cellar.id, crew.keeper.id],
  );
  const [failed]: { id: string }[] = await ds.query(
    `INSERT INTO mail_outbox (cellar_id, kind, to_address, subject, text_body, html_body, message_id, status, attempts, last_error)
     VALUES ($1, 'invitation', 'someone@example.test', 'Hello', 'text', '<p>html</p>', '<failed@example.test>', 'failed', 8, '550 no such user')
     RETURNING id`,
    [crew.cellar.id],
  );
  return { invitationId: invitation!.id, failedMailId: failed!.id };
}
