import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * `cw_readable_date(text)`: a date stored as text in a journal payload, or NULL when it cannot
 * be read (not YYYY-MM-DD, not a calendar day, or outside 1900–2200). Queries compare take-out
 * dates through it, so one bad stored value can never make a whole list fail.
 */
export class AddReadableDate1796170510000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE FUNCTION cw_readable_date(value text) RETURNS date
      LANGUAGE plpgsql IMMUTABLE PARALLEL SAFE AS $$
      BEGIN
        IF value IS NULL OR value !~ '^[0-9]{4}-[0-9]{2}-[0-9]{2}$' OR substr(value, 1, 4)::int NOT BETWEEN 1900 AND 2200 THEN
          RETURN NULL;
        END IF;
        RETURN value::date;
      EXCEPTION WHEN datetime_field_overflow OR invalid_datetime_format THEN
        RETURN NULL;
      END
      $$`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP FUNCTION cw_readable_date(text)`);
  }
}
