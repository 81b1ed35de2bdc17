/**
 * How a whole-cellar archive reads the journal: one cellar's entries, originals before the
 * amendments that refer to them, so a restore can insert them in this order. Kept here because
 * only the journal module names its table.
 */
export const JOURNAL_ARCHIVE_TABLE = {
  name: 'journal_entries',
  rows: 'SELECT * FROM journal_entries WHERE cellar_id = $1 ORDER BY (amends_entry_id IS NOT NULL), recorded_at, id',
} as const;
