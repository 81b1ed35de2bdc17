import type { DataSource, EntityManager } from 'typeorm';
import { fermentationState, type GravityReading } from '../../shared/calc';
import type { JournalPayload } from '../../shared/schemas/journal';
import type { Today } from '../../shared/schemas/today';
import { localDate, loadCellar } from './batch-context';
import { listBatches } from './batch-queries';
import type { CellarContext } from './cellar.service';
import { stateCondition } from './vessel-queries';

const DUE_WITHIN_DAYS = 7;
/** The Today screen lists this many ferments, newest first; the Batches list has the rest. */
const FERMENTS_SHOWN = 50;
/** The state is judged on recent readings: older ones cannot change a steady-for-days verdict. */
const READINGS_PER_BATCH = 12;

type FermentRow = { id: string; name: string; kind: Today['ferments'][number]['kind']; stage: Today['ferments'][number]['stage']; started_on: string; og: string | null; tolerance: string; last_sg: string | null; last_at: Date | null; vessel_names: string[] };
type ReadingRow = { id: string; batch_id: string; occurred_at: Date; payload: JournalPayload; amends_entry_id: string | null };

/** Corrected gravities of each batch, with amendments applied (latest wins). */
function readingsByBatch(rows: ReadingRow[]): Map<string, GravityReading[]> {
  const changes = new Map<string, Record<string, unknown>>();
  for (const r of rows) {
    if (r.payload.kind === 'amendment' && r.amends_entry_id) changes.set(r.amends_entry_id, { ...changes.get(r.amends_entry_id), ...r.payload.changes });
  }
  const byBatch = new Map<string, GravityReading[]>();
  for (const r of rows) {
    if (r.payload.kind !== 'reading') continue;
    const amended = { ...r.payload, ...changes.get(r.id) } as { correctedSg: number };
    byBatch.set(r.batch_id, [...(byBatch.get(r.batch_id) ?? []), { at: r.occurred_at, sg: Number(amended.correctedSg) }]);
  }
  return byBatch;
}

async function ferments(tx: EntityManager, cellarId: string, now: Date): Promise<Today['ferments']> {
  const rows: FermentRow[] = await tx.query(
    `SELECT b.id, b.name, b.kind, b.stage, b.started_on::text AS started_on, b.og, b.yeast_tolerance_abv AS tolerance,
            b.last_reading_sg AS last_sg, b.last_reading_at AS last_at,
            array_agg(v.name ORDER BY v.name) AS vessel_names
       FROM batches b JOIN vessels v ON v.batch_id = b.id
      WHERE b.cellar_id = $1 AND b.stage IN ('primary', 'secondary')
      GROUP BY b.id ORDER BY b.started_on DESC, b.id LIMIT $2`,
    [cellarId, FERMENTS_SHOWN],
  );
  if (rows.length === 0) return [];
  const readings = readingsByBatch(
    await tx.query(
      `WITH recent AS (
         SELECT id, batch_id, occurred_at, recorded_at, payload, amends_entry_id,
                row_number() OVER (PARTITION BY batch_id ORDER BY occurred_at DESC, recorded_at DESC) AS n
           FROM journal_entries WHERE batch_id = ANY($1) AND kind = 'reading')
       SELECT id, batch_id, occurred_at, payload, amends_entry_id FROM recent WHERE n <= $2
       UNION ALL
       SELECT a.id, a.batch_id, a.occurred_at, a.payload, a.amends_entry_id
         FROM journal_entries a JOIN recent r ON r.id = a.amends_entry_id AND r.n <= $2
        WHERE a.kind = 'amendment'
       ORDER BY occurred_at`,
      [rows.map((r) => r.id), READINGS_PER_BATCH],
    ),
  );
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    kind: r.kind,
    stage: r.stage,
    startedOn: r.started_on,
    og: r.og === null ? null : Number(r.og),
    lastReading: r.last_sg === null || !r.last_at ? null : { sg: Number(r.last_sg), at: r.last_at.toISOString() },
    state: r.og === null ? null : fermentationState({ og: Number(r.og), toleranceAbv: Number(r.tolerance), readings: readings.get(r.id) ?? [], now }),
    vesselNames: r.vessel_names,
  }));
}

async function additionsDue(tx: EntityManager, cellarId: string, today: string): Promise<Today['additionsDue']> {
  const rows: { batch_id: string; batch_name: string; id: string; name: string; remove_on: string }[] = await tx.query(
    `SELECT e.batch_id, b.name AS batch_name, e.id, e.payload->>'name' AS name, e.payload->>'removeOn' AS remove_on
       FROM journal_entries e JOIN batches b ON b.id = e.batch_id
      WHERE e.cellar_id = $1 AND e.kind = 'addition' AND e.payload->>'removeOn' IS NOT NULL
        AND (e.payload->>'removeOn')::date <= $2::date + $3::int
        AND NOT EXISTS (SELECT 1 FROM journal_entries r WHERE r.batch_id = e.batch_id AND r.kind = 'removed' AND r.payload->>'additionEntryId' = e.id::text)
      ORDER BY (e.payload->>'removeOn')::date`,
    [cellarId, today, DUE_WITHIN_DAYS],
  );
  return rows.map((r) => ({ batchId: r.batch_id, batchName: r.batch_name, entryId: r.id, name: r.name, removeOn: r.remove_on, overdue: r.remove_on < today }));
}

/**
 * Everything the Today screen shows, read in one snapshot: ferments with their state, what
 * needs racking, additions due out, free sanitised vessels by size and the bottle stock.
 */
export async function getToday(ds: DataSource, ctx: CellarContext): Promise<Today> {
  const now = new Date();
  const needsRacking = (await listBatches(ds, ctx, { needsRacking: true, sort: 'started-asc', page: 1, pageSize: 20 })).items;
  return ds.transaction('REPEATABLE READ', async (tx) => {
    const today = localDate(now, (await loadCellar(tx, ctx.cellarId)).timeZone);
    const free: { capacity: number; count: number }[] = await tx.query(
      `SELECT v.capacity_l::float8 AS capacity, COUNT(*)::int AS count
         FROM vessels v JOIN cellars c ON c.id = v.cellar_id
        WHERE v.cellar_id = $1 AND ${stateCondition('sanitised', () => '$2::timestamptz')}
        GROUP BY v.capacity_l ORDER BY v.capacity_l`,
      [ctx.cellarId, now.toISOString()],
    );
    const [stock]: { lots: number; bottles: number }[] = await tx.query(
      `SELECT COUNT(DISTINCT l.id)::int AS lots, COALESCE(SUM(c.bottles_left), 0)::int AS bottles
         FROM bottle_lots l JOIN bottle_cases c ON c.lot_id = l.id WHERE l.cellar_id = $1 AND c.bottles_left > 0`,
      [ctx.cellarId],
    );
    return {
      ferments: await ferments(tx, ctx.cellarId, now),
      needsRacking,
      additionsDue: await additionsDue(tx, ctx.cellarId, today),
      freeSanitised: free.map((f) => ({ capacityL: f.capacity, count: f.count })),
      bottles: { lots: stock?.lots ?? 0, bottlesLeft: stock?.bottles ?? 0 },
    };
  });
}
