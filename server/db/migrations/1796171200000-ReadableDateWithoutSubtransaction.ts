import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * `cw_readable_date(text)` again, checking the day against its month instead of catching the
 * cast's error. The catching version ran an EXCEPTION block, which opens a subtransaction, and
 * PostgreSQL refuses those in a parallel worker: on a cellar large enough for the planner to
 * scan journal_entries in parallel, Today answered 500 ("cannot start subtransactions during a
 * parallel operation"). Same answers: a YYYY-MM-DD calendar day in 1900–2200, else NULL.
 */
export class ReadableDateWithoutSubtransaction1796171200000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE OR REPLACE FUNCTION cw_readable_date(value text) RETURNS date
      LANGUAGE plpgsql IMMUTABLE PARALLEL SAFE AS $$
      DECLARE
        y int;
        m int;
        d int;
      BEGIN
        IF value IS NULL OR value !~ '^[0-9]{4}-[0-9]{2}-[0-9]{2}$' THEN
          RETURN NULL;
        END IF;
        y := substr(value, 1, 4)::int;
        m := substr(value, 6, 2)::int;
        d := substr(value, 9, 2)::int;
        IF y NOT BETWEEN 1900 AND 2200 OR m NOT BETWEEN 1 AND 12 OR d < 1 THEN
          RETURN NULL;
        END IF;
        -- The month's last day, from the first of the next month: leap years as the calendar has them.
        IF d > extract(day FROM make_date(y, m, 1) + interval '1 month' - interval '1 day') THEN
          RETURN NULL;
        END IF;
        RETURN make_date(y, m, d);
      END
      $$`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE OR REPLACE FUNCTION cw_readable_date(value text) RETURNS date
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
}
