import { DEVICE_ARCHIVE_TABLE } from '../devices/device-archive';
import { JOURNAL_ARCHIVE_TABLE } from '../journal/journal-archive';

/**
 * What a whole-cellar archive holds: every table of the cellar's record, in an order where
 * each row's references come before it (so a restore inserts them in this order). Members,
 * invitations, mail and sessions are the installation's, not the cellar's record: they stay.
 * `rows` selects one cellar's rows ($1), in a stable order.
 */
export interface ArchiveTable {
  name: string;
  rows: string;
}

const ofCellar = (table: string, order = 'id') => `SELECT * FROM ${table} WHERE cellar_id = $1 ORDER BY ${order}`;

export const ARCHIVE_TABLES: ArchiveTable[] = [
  { name: 'racks', rows: ofCellar('racks') },
  { name: 'shelves', rows: `SELECT s.* FROM shelves s JOIN racks r ON r.id = s.rack_id WHERE r.cellar_id = $1 ORDER BY s.id` },
  { name: 'plans', rows: ofCellar('plans') },
  { name: 'plan_seedings', rows: ofCellar('plan_seedings', 'cellar_id') },
  { name: 'batches', rows: ofCellar('batches') },
  {
    name: 'batch_parents',
    rows: `SELECT p.* FROM batch_parents p JOIN batches b ON b.id = p.child_id WHERE b.cellar_id = $1 ORDER BY p.child_id, p.parent_id`,
  },
  { name: 'vessels', rows: ofCellar('vessels') },
  JOURNAL_ARCHIVE_TABLE,
  { name: 'photos', rows: ofCellar('photos') },
  { name: 'bottle_lots', rows: ofCellar('bottle_lots') },
  { name: 'bottle_cases', rows: ofCellar('bottle_cases') },
  { name: 'bottle_departures', rows: ofCellar('bottle_departures') },
  { name: 'placements', rows: ofCellar('placements') },
  { name: 'one_off_tasks', rows: ofCellar('one_off_tasks') },
  { name: 'task_states', rows: ofCellar('task_states', 'task_key') },
  { name: 'audit_events', rows: ofCellar('audit_events') },
  { name: 'import_row_keys', rows: ofCellar('import_row_keys', 'target, row_key') },
  // Digital hydrometers without their token (it is the installation's key, not the cellar's record).
  DEVICE_ARCHIVE_TABLE,
  { name: 'device_readings', rows: ofCellar('device_readings', 'device_id, taken_at') },
];

/** Columns whose values are label codes printed on labels; a colliding one is replaced and listed. */
export const LABEL_CODE_TABLES = ['vessels', 'bottle_lots', 'bottle_cases'] as const;

/** Photo bytes travel as files of their own in the archive, not inside the JSON. */
export const PHOTO_COLUMNS = ['data', 'thumbnail'] as const;
