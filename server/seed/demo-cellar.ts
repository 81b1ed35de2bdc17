import type { EntityManager } from 'typeorm';
import { abvBy, casesFrom, correctGravity } from '../../shared/calc';
import type { JournalPayload } from '../../shared/schemas/journal';
import type { Actor } from '../core/actor';
import { BatchParent } from '../entities/batch-parent.entity';
import { Batch } from '../entities/batch.entity';
import { BottleCaseRow } from '../entities/bottle-case.entity';
import { BottleDeparture } from '../entities/bottle-departure.entity';
import { BottleLotRow } from '../entities/bottle-lot.entity';
import { Placement } from '../entities/placement.entity';
import { Rack } from '../entities/rack.entity';
import { Shelf } from '../entities/shelf.entity';
import { Vessel } from '../entities/vessel.entity';
import { appendEntry } from '../journal/journal';
import { readingCachesForSplit } from '../batches/split-lineage';
import { newLabelCode } from '../labels/label-codes';
import { DEMO_BATCHES, DEMO_RACKS, DEMO_VESSELS, type DemoBatch } from './demo-records';

const DAY_MS = 86_400_000;

/**
 * Writes the demo cellar's racks, vessels, a year of batches and their journals, and a
 * bottled cider in cases. Every story is told through the same journal writer the app uses,
 * so stages and cached figures come out as they would from real work.
 */
export async function seedDemoRecords(tx: EntityManager, people: { keeper: Actor; hand: Actor }, now = new Date()): Promise<void> {
  const cellarId = people.keeper.cellarId;
  const daysAgo = (days: number, hour = 18) => {
    const d = new Date(now.getTime() - days * DAY_MS);
    d.setUTCHours(hour, 0, 0, 0);
    return d;
  };

  // Racks and shelves.
  const shelfIds = new Map<string, string>();
  for (const r of DEMO_RACKS) {
    const rack = await tx.getRepository(Rack).save({ cellarId, name: r.name, description: r.description });
    for (const [i, slots] of r.shelves.entries()) {
      const shelf = await tx.getRepository(Shelf).save({ rackId: rack.id, number: i + 1, slotCount: slots });
      shelfIds.set(`${r.key}:${i + 1}`, shelf.id);
    }
  }

  // Vessels, empty at first; the stories below fill and empty them in time order.
  const vessels = new Map<string, Vessel>();
  for (const v of DEMO_VESSELS) {
    const vessel = await tx.getRepository(Vessel).save({
      cellarId,
      code: await newLabelCode(tx),
      name: v.name,
      kind: v.kind,
      material: v.material,
      capacityL: v.capacityL,
      cleaningState: v.cleaning,
      sanitisedAt: v.sanitisedDaysAgo === undefined ? null : daysAgo(v.sanitisedDaysAgo, 9),
      retiredAt: v.retired ? daysAgo(30) : null,
      batchId: null,
      volumeL: null,
      filledAt: null,
      notes: '',
    });
    vessels.set(v.key, vessel);
    if (v.place) {
      await tx
        .getRepository(Placement)
        .save({ cellarId, shelfId: shelfIds.get(`${v.place[0]}:${v.place[1]}`)!, slot: v.place[2], vesselId: vessel.id, caseId: null });
    }
  }
  const ref = (key: string) => {
    const v = vessels.get(key)!;
    return { vesselId: v.id, vesselName: v.name };
  };
  const fill = async (key: string, batchId: string, litres: number, at: Date) => {
    await tx.getRepository(Vessel).update({ id: vessels.get(key)!.id }, { batchId, volumeL: litres, filledAt: at });
  };
  const empty = async (key: string) => {
    await tx
      .getRepository(Vessel)
      .update({ id: vessels.get(key)!.id }, { batchId: null, volumeL: null, filledAt: null, cleaningState: 'dirty', sanitisedAt: null });
  };
  const batchKeys = new Map<string, { row: Batch; def: DemoBatch }>();
  const log = (key: string, payload: JournalPayload, at: Date, who: Actor = people.hand) =>
    appendEntry(tx, who, batchKeys.get(key)!.row.id, payload, { occurredAt: at });

  const start = async (def: DemoBatch) => {
    const startedAt = daysAgo(def.startedDaysAgo, 10);
    const row = await tx.getRepository(Batch).save({
      cellarId,
      name: def.name,
      kind: def.kind,
      ingredients: def.ingredients,
      yeastName: def.yeast.name,
      yeastToleranceAbv: def.yeast.toleranceAbv,
      plannedVolumeL: def.plannedVolumeL,
      startedOn: startedAt.toISOString().slice(0, 10),
      og: def.og,
      targetSweetness: null,
      notes: def.notes,
      createdBy: people.keeper.userId,
    });
    batchKeys.set(def.key, { row, def });
    for (const [key, litres] of def.startIn) await fill(key, row.id, litres, startedAt);
    const volumeL = def.startIn.reduce((sum, [, l]) => sum + l, 0);
    await log(
      def.key,
      { kind: 'started', volumeL, og: def.og, vessels: def.startIn.map(([k, l]) => ({ ...ref(k), volumeL: l })), parents: [], override: null },
      startedAt,
      people.keeper,
    );
  };
  /** Logs the readings taken after day `afterDay` and up to day `upToDay`. */
  const readings = async (key: string, afterDay: number, upToDay = Infinity) => {
    const { def } = batchKeys.get(key)!;
    for (const r of def.readings.filter((x) => x.day > afterDay && x.day <= upToDay)) {
      const corrected = r.temperatureC === undefined ? r.sg : Number(correctGravity(r.sg, r.temperatureC, 20).toFixed(4));
      await log(
        key,
        { kind: 'reading', sg: r.sg, temperatureC: r.temperatureC ?? null, calibrationC: 20, correctedSg: corrected, ph: null, vesselId: null },
        daysAgo(def.startedDaysAgo - r.day, 8),
      );
    }
  };
  const rack = async (key: string, day: number, from: [string, number][], to: [string, number][]) => {
    const { def, row } = batchKeys.get(key)!;
    const at = daysAgo(def.startedDaysAgo - day, 11);
    for (const [k] of from) await empty(k);
    for (const [k, l] of to) await fill(k, row.id, l, at);
    const lossL = from.reduce((s, [, l]) => s + l, 0) - to.reduce((s, [, l]) => s + l, 0);
    await log(
      key,
      {
        kind: 'racked',
        from: from.map(([k, l]) => ({ ...ref(k), volumeL: l })),
        to: to.map(([k, l]) => ({ ...ref(k), volumeL: l })),
        lossL,
        override: null,
      },
      at,
    );
  };

  // The cider: pressed last autumn, bottled and partly drunk.
  const cider = DEMO_BATCHES.find((b) => b.key === 'cider')!;
  await start(cider);
  await readings('cider', -1, 30);
  await rack('cider', 40, [['f2', 23]], [['bigGlass', 21.5]]);
  await readings('cider', 30);
  await bottleCider(daysAgo(210, 14));

  // The metheglin: one racking, stabilised, a gallon split off for vanilla; past six months.
  await start(DEMO_BATCHES.find((b) => b.key === 'linden')!);
  await readings('linden', -1, 30);
  await rack(
    'linden',
    34,
    // Half a litre left on the lees, and the carboy filled into its neck (common practice).
    [['f1', 27]],
    [
      ['bigGlass', 22],
      ['demi1', 4.5],
    ],
  );
  await readings('linden', 30);
  await log(
    'linden',
    { kind: 'addition', category: 'stabiliser', name: 'Potassium metabisulfite', amount: 1.1, unit: 'g', vesselId: null, removeOn: null },
    daysAgo(110),
  );
  await log(
    'linden',
    { kind: 'addition', category: 'stabiliser', name: 'Potassium sorbate', amount: 4.3, unit: 'g', vesselId: null, removeOn: null },
    daysAgo(110),
  );
  await splitVanilla(daysAgo(90, 12));
  await log(
    'linden',
    { kind: 'tasted', appearance: 'Pale gold, brilliant', aroma: 'Lime blossom, beeswax', flavour: 'Dry, floral, a little hot still', score: 6 },
    daysAgo(40),
    people.keeper,
  );
  // Tasted against its vanilla split the next day, for the Compare view.
  await log(
    'vanilla',
    { kind: 'tasted', appearance: 'Pale gold, brilliant', aroma: 'Vanilla over lime blossom', flavour: 'Rounder, softer finish', score: 7 },
    daysAgo(39),
    people.keeper,
  );

  // The melomel: fruit in primary, racked once, oak in now.
  await start(DEMO_BATCHES.find((b) => b.key === 'blackcurrant')!);
  await readings('blackcurrant', -1, 30);
  await rack('blackcurrant', 30, [['f2', 12]], [['carboyB', 11]]);
  await readings('blackcurrant', 30);
  await log(
    'blackcurrant',
    {
      kind: 'addition',
      category: 'oak',
      name: 'Medium-toast French oak cubes',
      amount: 30,
      unit: 'g',
      vesselId: vessels.get('carboyB')!.id,
      removeOn: daysAgo(-7).toISOString().slice(0, 10),
    },
    daysAgo(14),
  );

  // The cyser: racked off the fruit, then stuck well above its expected finish.
  await start(DEMO_BATCHES.find((b) => b.key === 'quince')!);
  await readings('quince', -1, 28);
  await rack('quince', 28, [['f2', 19]], [['carboyA', 18]]);
  await readings('quince', 28);
  await log(
    'quince',
    { kind: 'note', text: 'Gravity has not moved for weeks. Try a restart with a fresh, acclimatised yeast.' },
    daysAgo(4),
    people.keeper,
  );

  // The traditional: ten days into primary.
  await start(DEMO_BATCHES.find((b) => b.key === 'hawthorn')!);
  await readings('hawthorn', -1);
  await log(
    'hawthorn',
    { kind: 'degassed', vesselId: vessels.get('f1')!.id, note: 'Stirred out the CO₂ before the second nutrient dose.' },
    daysAgo(2),
  );

  // Vessels that were used and then cleaned keep their final cleaning state from the list.
  for (const v of DEMO_VESSELS) {
    const row = await tx.getRepository(Vessel).findOneByOrFail({ id: vessels.get(v.key)!.id });
    if (!row.batchId && v.cleaning !== 'dirty') {
      await tx
        .getRepository(Vessel)
        .update({ id: row.id }, { cleaningState: v.cleaning, sanitisedAt: v.sanitisedDaysAgo === undefined ? null : daysAgo(v.sanitisedDaysAgo, 9) });
    }
  }

  async function bottleCider(at: Date) {
    const { row } = batchKeys.get('cider')!;
    const bottleCount = 42;
    const perCase = 12;
    const lot = await tx.getRepository(BottleLotRow).save({
      cellarId,
      batchId: row.id,
      code: await newLabelCode(tx),
      bottledOn: at.toISOString().slice(0, 10),
      bottleMl: 500,
      bottleCount,
      closure: 'crown-cap',
      carbonation: 'still',
      sulfiteAdded: true,
      abvEstimate: Number(abvBy(1.055, 0.999).toFixed(1)),
      note: 'Still, dry, a touch of tannin.',
    });
    const { cases, loose } = casesFrom(bottleCount, perCase);
    const counts = [...Array(cases).fill(perCase), ...(loose ? [loose] : [])];
    const caseRows: BottleCaseRow[] = [];
    for (const [i, count] of counts.entries()) {
      const c = await tx
        .getRepository(BottleCaseRow)
        .save({ cellarId, lotId: lot.id, code: await newLabelCode(tx), number: i + 1, bottlesInitial: count, bottlesLeft: count });
      caseRows.push(c);
      await tx.getRepository(Placement).save({ cellarId, shelfId: shelfIds.get('stair:1')!, slot: i + 1, vesselId: null, caseId: c.id });
    }
    await empty('bigGlass');
    await log(
      'cider',
      {
        kind: 'bottled',
        lotId: lot.id,
        lotCode: lot.code,
        bottleCount,
        bottleMl: 500,
        caseCount: counts.length,
        from: [{ ...ref('bigGlass'), volumeL: 21.5 }],
        lossL: 0.5,
        confirmedNotFinished: false,
      },
      at,
    );
    const drawn: [number, number, 'drunk' | 'gift', string, number][] = [
      [3, 3, 'drunk', 'Harvest supper', 150],
      [3, 2, 'gift', 'For the neighbours at the lane end', 120],
      [2, 4, 'drunk', '', 60],
    ];
    for (const [caseIndex, count, reason, note, ago] of drawn) {
      const c = caseRows[caseIndex]!;
      await tx
        .getRepository(BottleDeparture)
        .save({ cellarId, caseId: c.id, count, reason, note, occurredAt: daysAgo(ago), authorId: people.keeper.userId });
      c.bottlesLeft -= count;
      await tx.getRepository(BottleCaseRow).update({ id: c.id }, { bottlesLeft: c.bottlesLeft });
    }
    await log(
      'cider',
      { kind: 'tasted', appearance: 'Hazy amber', aroma: 'Baked apple, a little funk', flavour: 'Dry, firm tannin, long finish', score: 7 },
      daysAgo(60),
      people.keeper,
    );
  }

  async function splitVanilla(at: Date) {
    const parent = batchKeys.get('linden')!.row;
    const child = await tx.getRepository(Batch).save({
      cellarId,
      name: 'Linden & Vanilla',
      kind: 'metheglin',
      ingredients: parent.ingredients,
      yeastName: parent.yeastName,
      yeastToleranceAbv: parent.yeastToleranceAbv,
      plannedVolumeL: 4.5,
      // A split is the same must: it keeps its parent's start and latest reading (server/batches/split-lineage.ts).
      startedOn: parent.startedOn,
      og: parent.og,
      targetSweetness: null,
      notes: 'A gallon of the linden metheglin on a split vanilla pod.',
      createdBy: people.keeper.userId,
      ...(await readingCachesForSplit(tx, parent.id, at)),
    });
    batchKeys.set('vanilla', { row: child, def: { ...batchKeys.get('linden')!.def, key: 'vanilla' } });
    await tx.getRepository(BatchParent).save({ childId: child.id, parentId: parent.id, volumeL: 4.5 });
    await tx.getRepository(Vessel).update({ id: vessels.get('demi1')!.id }, { batchId: child.id });
    await log(
      'linden',
      { kind: 'split', childBatchId: child.id, childName: child.name, vessels: [{ ...ref('demi1'), volumeL: 4.5 }] },
      at,
      people.keeper,
    );
    await log(
      'vanilla',
      {
        kind: 'started',
        volumeL: 4.5,
        og: parent.og,
        vessels: [{ ...ref('demi1'), volumeL: 4.5 }],
        parents: [{ batchId: parent.id, name: parent.name, volumeL: 4.5 }],
        override: null,
      },
      at,
      people.keeper,
    );
    await log(
      'vanilla',
      {
        kind: 'addition',
        category: 'spice',
        name: 'Vanilla pod, split',
        amount: 1,
        unit: 'piece',
        vesselId: vessels.get('demi1')!.id,
        removeOn: null,
      },
      at,
      people.keeper,
    );
  }
}
