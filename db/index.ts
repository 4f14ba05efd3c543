import { Kysely, PostgresDialect } from 'kysely';
import pg from 'pg';
import type { Database } from '@/db/types';

// pg returns int8 and numeric as strings; our bigints (audit ids, counts) fit in a double.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number(v));
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => Number(v));

export type DB = Kysely<Database>;

function createPool(connectionString: string, max: number): pg.Pool {
  const pool = new pg.Pool({ connectionString, max, connectionTimeoutMillis: 5_000, idleTimeoutMillis: 30_000 });
  // An idle client losing its connection (database restart) must not crash the process.
  pool.on('error', (err) => console.error('[db] idle client error:', err.message));
  return pool;
}

export function createDb(connectionString: string, max = 10): DB {
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool: createPool(connectionString, max) }) });
}

const globalForDb = globalThis as unknown as { nookpassDb?: DB; nookpassPool?: pg.Pool };

function appPool(): pg.Pool {
  if (!globalForDb.nookpassPool) {
    const url = process.env.DATABASE_URL;
    if (!url) throw new Error('DATABASE_URL is not set; start NookPass with npm start.');
    globalForDb.nookpassPool = createPool(url, 10);
  }
  return globalForDb.nookpassPool;
}

/** The app's one Kysely instance, created on first use so builds never connect. */
export function getDb(): DB {
  globalForDb.nookpassDb ??= new Kysely<Database>({ dialect: new PostgresDialect({ pool: appPool() }) });
  return globalForDb.nookpassDb;
}

/** The pool behind getDb(), for libraries that speak to PostgreSQL themselves (the rate limiter's store). */
export function getPool(): pg.Pool {
  return appPool();
}
