/**
 * How a whole-cellar archive reads devices: everything but the token's hash, so a restore
 * never holds a second copy of a working key (and never collides with the original's). A
 * restored device has no token until a Keeper issues one.
 */
export const DEVICE_ARCHIVE_TABLE = {
  name: 'devices',
  rows: `SELECT id, cellar_id, vessel_id, name, NULL::bytea AS token_hash, token_end, created_by, created_at, revoked_at
           FROM devices WHERE cellar_id = $1 ORDER BY id`,
} as const;
