import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { PGlite } from '@electric-sql/pglite';
import type { PgDatabase, PgQueryResultHKT } from 'drizzle-orm/pg-core';
import { drizzle as drizzlePglite } from 'drizzle-orm/pglite';
import { migrate as migratePglite } from 'drizzle-orm/pglite/migrator';
import { drizzle as drizzlePg } from 'drizzle-orm/node-postgres';
import { migrate as migratePg } from 'drizzle-orm/node-postgres/migrator';
import pg from 'pg';
import { consoleLogger, type Logger } from '../logger';
import * as schema from './schema';

export type Schema = typeof schema;

/**
 * The one database type repositories take. Both drivers (embedded PGlite and node-postgres)
 * produce a `PgDatabase` over the same schema, so a repository written against `Db` runs on
 * either; a transaction (`db.transaction(async (tx) => …)`) hands out a `Db` too.
 * Driver-specific behaviour (result shapes of `db.execute`) is not part of it: use the query
 * builder, or `Database.query` for raw SQL.
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type Db = PgDatabase<PgQueryResultHKT & any, Schema>;

export type DatabaseKind = 'pglite' | 'postgres';

export type Database = {
  db: Db;
  kind: DatabaseKind;
  /** Raw SQL with $1… parameters; returns the rows. For tests, tools and one-off maintenance. */
  query<T = Record<string, unknown>>(sqlText: string, params?: unknown[]): Promise<T[]>;
  close(): Promise<void>;
};

export type OpenDatabaseOptions = {
  /** PGlite keeps its files in `<dataDir>/pglite`. Ignored when `databaseUrl` is set. */
  dataDir: string;
  /** postgres://… selects node-postgres against that server. */
  databaseUrl?: string;
  /** Defaults to the repository's `drizzle/` folder. */
  migrationsFolder?: string;
  /** Apply pending migrations before returning (default true). */
  migrate?: boolean;
  /** Where the PostgreSQL pool reports an idle connection the server ended (default: the console logger). */
  logger?: Pick<Logger, 'warn'>;
};

/** Finds `drizzle/` by walking up from this file (works from server/db and from dist/server). */
export function defaultMigrationsFolder(): string {
  let dir = path.dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const candidate = path.join(dir, 'drizzle');
    if (fs.existsSync(path.join(candidate, 'meta', '_journal.json'))) return candidate;
    const parent = path.dirname(dir);
    if (parent === dir) throw new Error('The migrations folder drizzle/ was not found above ' + fileURLToPath(import.meta.url));
    dir = parent;
  }
}

/** Opens the database, applies migrations from `drizzle/` and returns it. */
export async function openDatabase(options: OpenDatabaseOptions): Promise<Database> {
  const migrationsFolder = options.migrationsFolder ?? defaultMigrationsFolder();
  const shouldMigrate = options.migrate ?? true;

  if (options.databaseUrl) {
    const pool = new pg.Pool({ connectionString: options.databaseUrl, max: 10 });
    // An idle client whose connection the server ends (restart, pg_terminate_backend: 57P01) is
    // reported on the pool; without a listener node-postgres would crash the process. The pool
    // drops that client and opens a new one on the next query.
    const logger = options.logger ?? consoleLogger;
    pool.on('error', (err) => {
      logger.warn('PostgreSQL closed an idle connection; the pool opens a new one when needed', { error: err });
    });
    const db = drizzlePg({ client: pool, schema });
    try {
      if (shouldMigrate) await withMigrationLock(pool, () => migratePg(db, { migrationsFolder }));
    } catch (err) {
      await pool.end();
      throw err;
    }
    return {
      db: db as Db,
      kind: 'postgres',
      async query<T>(sqlText: string, params: unknown[] = []) {
        const result = await pool.query(sqlText, params);
        return result.rows as T[];
      },
      close: () => pool.end(),
    };
  }

  // PGlite fails with ENOENT when the parent folder is missing.
  const dir = path.join(options.dataDir, 'pglite');
  fs.mkdirSync(dir, { recursive: true });
  // Durability (DEVELOPERS.md "Durability"): relaxedDurability stays false, so a query resolves
  // only after PGlite has handed its writes to the file system; synchronous_commit stays on (the
  // PostgreSQL default), so a commit's WAL record is written before COMMIT returns. PGlite writes
  // through Node's fs synchronously; a killed process loses no acknowledged commit
  // (tests/server/security/crash-safety.test.ts). PGlite runs with fsync off, so an OS crash or
  // power loss can: use DATABASE_URL (a PostgreSQL server with fsync on) where that matters.
  const client = new PGlite({ dataDir: dir, relaxedDurability: false });
  const db = drizzlePglite({ client, schema });
  try {
    if (shouldMigrate) await migratePglite(db, { migrationsFolder });
  } catch (err) {
    await client.close();
    throw err;
  }
  return {
    db: db as unknown as Db,
    kind: 'pglite',
    async query<T>(sqlText: string, params: unknown[] = []) {
      const result = await client.query(sqlText, params);
      return result.rows as T[];
    },
    close: async () => {
      if (!client.closed) await client.close();
    },
  };
}

/**
 * Several app instances may start at once against one server: a session-level advisory lock,
 * held on its own connection, lets one of them apply the migrations while the others wait and
 * then find nothing left to apply.
 */
async function withMigrationLock<T>(pool: pg.Pool, fn: () => Promise<T>): Promise<T> {
  const lockClient = await pool.connect();
  try {
    await lockClient.query('SELECT pg_advisory_lock(hashtext($1))', ['emberline:migrations']);
    return await fn();
  } finally {
    await lockClient.query('SELECT pg_advisory_unlock(hashtext($1))', ['emberline:migrations']).catch(() => {});
    lockClient.release();
  }
}
