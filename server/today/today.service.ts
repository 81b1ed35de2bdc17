import dayjs from 'dayjs';
import type { EntityManager } from 'typeorm';
import { fermentationState, type GravityReading } from '../../shared/calc';
import type { ReadingView } from '../../shared/domain/journal';
import type { Today } from '../../shared/schemas/today';
import { listBatches } from '../batches/batch-reads.service';
import { inheritedReadings } from '../batches/split-lineage';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { localDate } from '../core/local-date';
import { additionsDueOut, recentReadings } from '../journal/journal-queries';
import { stateCondition } from '../vessels/vessel-queries';

const DUE_WITHIN_DAYS = 7;
/** The Today screen lists this many ferments, newest first; the Batches list has the rest. */
const FERMENTS_SHOWN = 50;
/** The state is judged on recent readings: older ones cannot change a steady-for-days verdict. */
const READINGS_PER_BATCH = 12;

type FermentRow = {
  id: string;
  name: string;
  kind: Today['ferments'][number]['kind'];
  stage: Today['ferments'][number]['stage'];
  started_on: string;
  og: string | null;
  tolerance: string;
  last_sg: string | null;
  last_at: Date | null;
  vessel_names: string[];
  has_parents: boolean;
};
/** Readings as the fermentation state takes them: corrected gravity and when. */
const gravityReadings = (readings: ReadingView[]): GravityReading[] => readings.map((r) => ({ at: new Date(r.at), sg: r.correctedSg }));

async function ferments(tx: EntityManager, cellarId: string, now: Date): Promise<Today['ferments']> {
  const rows: FermentRow[] = await tx.query(
    `SELECT b.id, b.name, b.kind, b.stage, b.started_on::text AS started_on, b.og, b.yeast_tolerance_abv AS tolerance,
            b.last_reading_sg AS last_sg, b.last_reading_at AS last_at,
            array_agg(v.name ORDER BY v.name) AS vessel_names,
            EXISTS (SELECT 1 FROM batch_parents bp WHERE bp.child_id = b.id) AS has_parents
       FROM batches b JOIN vessels v ON v.batch_id = b.id
      WHERE b.cellar_id = $1 AND b.stage IN ('primary', 'secondary')
      GROUP BY b.id ORDER BY b.started_on DESC, b.id LIMIT $2`,
    [cellarId, FERMENTS_SHOWN],
  );
  if (rows.length === 0) return [];
  const readings = await recentReadings(
    tx,
    rows.map((r) => r.id),
    READINGS_PER_BATCH,
  );
  // A split's state follows the must it came from: its parent's readings up to the split come first.
  for (const r of rows.filter((row) => row.has_parents)) {
    const inherited = await inheritedReadings(tx, r.id);
    if (inherited.length) readings.set(r.id, [...inherited, ...(readings.get(r.id) ?? [])].slice(-READINGS_PER_BATCH));
  }
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    kind: r.kind,
    stage: r.stage,
    startedOn: r.started_on,
    og: r.og === null ? null : Number(r.og),
    lastReading: r.last_sg === null || !r.last_at ? null : { sg: Number(r.last_sg), at: r.last_at.toISOString() },
    state:
      r.og === null
        ? null
        : fermentationState({ og: Number(r.og), toleranceAbv: Number(r.tolerance), readings: gravityReadings(readings.get(r.id) ?? []), now }),
    vesselNames: r.vessel_names,
  }));
}

async function additionsDue(tx: EntityManager, cellarId: string, today: string): Promise<Today['additionsDue']> {
  const rows = await additionsDueOut(tx, cellarId, dayjs(today).add(DUE_WITHIN_DAYS, 'day').format('YYYY-MM-DD'));
  return rows.map((r) => ({ ...r, overdue: r.removeOn < today }));
}

/**
 * Everything the Today screen shows, read in one snapshot: ferments with their state, what
 * needs racking, additions due out, free sanitised vessels by size and the bottle stock.
 */
export async function getToday(actor: Actor, tx: EntityManager): Promise<Today> {
  requireRole(actor, 'guest');
  const now = new Date();
  const needsRacking = (await listBatches(actor, tx, { needsRacking: true, sort: 'started-asc', page: 1, pageSize: 20 })).items;
  const today = localDate(now, (await loadCellar(tx, actor.cellarId)).timeZone);
  const free: { capacity: number; count: number }[] = await tx.query(
    `SELECT v.capacity_l::float8 AS capacity, COUNT(*)::int AS count
       FROM vessels v JOIN cellars c ON c.id = v.cellar_id
      WHERE v.cellar_id = $1 AND ${stateCondition('sanitised', () => '$2::timestamptz')}
      GROUP BY v.capacity_l ORDER BY v.capacity_l`,
    [actor.cellarId, now.toISOString()],
  );
  const [stock]: { lots: number; bottles: number }[] = await tx.query(
    `SELECT COUNT(DISTINCT l.id)::int AS lots, COALESCE(SUM(c.bottles_left), 0)::int AS bottles
       FROM bottle_lots l JOIN bottle_cases c ON c.lot_id = l.id WHERE l.cellar_id = $1 AND c.bottles_left > 0`,
    [actor.cellarId],
  );
  return {
    ferments: await ferments(tx, actor.cellarId, now),
    needsRacking,
    additionsDue: await additionsDue(tx, actor.cellarId, today),
    freeSanitised: free.map((f) => ({ capacityL: f.capacity, count: f.count })),
    bottles: { lots: stock?.lots ?? 0, bottlesLeft: stock?.bottles ?? 0 },
  };
}
