import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * `devices`: digital hydrometers a Keeper let in, each bound to a vessel (it follows whatever
 * batch is in that vessel). Only the SHA-256 of a device's token is kept; a revoked device keeps
 * its row so its readings still say where they came from. A restored archive brings devices
 * back without a token (token_hash NULL): they need a new one.
 *
 * `device_readings`: what devices post, one row each, never journal entries. One device and
 * one moment make one reading (the primary key): a reading sent twice is kept once.
 */
export class CreateDevices1796170800000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE devices (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        vessel_id uuid REFERENCES vessels(id) ON DELETE SET NULL,
        name varchar(60) NOT NULL,
        token_hash bytea,
        token_end varchar(4) NOT NULL,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        revoked_at timestamptz
      )`);
    await q.query(`CREATE UNIQUE INDEX uq_devices_token_hash ON devices (token_hash)`);
    await q.query(`CREATE INDEX ix_devices_cellar ON devices (cellar_id, created_at)`);
    await q.query(`
      CREATE TABLE device_readings (
        device_id uuid NOT NULL REFERENCES devices(id) ON DELETE CASCADE,
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        batch_id uuid NOT NULL REFERENCES batches(id) ON DELETE CASCADE,
        taken_at timestamptz NOT NULL,
        received_at timestamptz NOT NULL DEFAULT now(),
        sg numeric(5,4) NOT NULL,
        temperature_c numeric(5,2),
        battery_v numeric(4,2),
        tilt_deg numeric(5,2),
        PRIMARY KEY (device_id, taken_at)
      )`);
    await q.query(`CREATE INDEX ix_device_readings_batch_time ON device_readings (batch_id, taken_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE device_readings`);
    await q.query(`DROP TABLE devices`);
  }
}
