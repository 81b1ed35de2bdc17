import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { entities, migrations } from './schema';

/**
 * A DataSource for the given database. `synchronize` stays off: the schema changes only
 * through migrations.
 */
export function createDataSource(url: string): DataSource {
  return new DataSource({
    type: 'postgres',
    url,
    entities,
    migrations,
    synchronize: false,
    migrationsTransactionMode: 'each',
    logging: ['error'],
    extra: { max: 10 },
  });
}

/** Used by the TypeORM CLI (`npm run migration:run`), which needs DATABASE_URL. */
export default createDataSource(process.env.DATABASE_URL ?? 'postgres://localhost/cellarwright');
