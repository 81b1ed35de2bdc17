import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { entities, migrations } from './schema';

/**
 * Server settings every connection of the app asks for. JIT compilation off: it pays off for long
 * analytical queries, while ours are short, and compiling cost Today ~80 ms of its ~230 ms at
 * 10,000 batches (`npm run bench:tasks`) — on any PostgreSQL, ours or a hosted one.
 */
export const CONNECTION_OPTIONS = '-c jit=off';

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
    extra: { max: 10, options: CONNECTION_OPTIONS },
  });
}

/** Used by the TypeORM CLI (`npm run migration:run`), which needs DATABASE_URL. */
export default createDataSource(process.env.DATABASE_URL ?? 'postgres://localhost/cellarwright');
