/**
 * Restore a backup made by `npm run backup`:
 *
 *   npm run restore -- FILE [--force]
 *
 * Embedded database: loads the tarball into a fresh `DATA_DIR/pglite` (PGlite's `loadDataDir`),
 * then opens it once as the server would (pending migrations applied). A non-empty folder is
 * refused without --force; with --force it is moved aside to `pglite.replaced-<time>`, never
 * deleted. PostgreSQL server: `pg_restore` into DATABASE_URL; a database that has tables already
 * is refused without --force (then `--clean --if-exists`). Stop the server before restoring.
 */
import { execFile } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { promisify } from 'node:util';
import { PGlite } from '@electric-sql/pglite';
import pg from 'pg';
import { ConfigError, loadConfig, type Config } from '../config/env';
import { openDatabase } from '../db/client';
import { CliError, pgliteDir } from './backup';

const run = promisify(execFile);

export type RestoreResult = { kind: 'pglite' | 'postgres'; movedAside?: string };

/** What a backup file is, from its first bytes: gzip or tar (PGlite), or pg_dump's custom format. */
export function backupKind(bytes: Buffer): 'pglite' | 'postgres' | null {
  if (bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b) return 'pglite';
  if (bytes.length >= 262 && bytes.subarray(257, 262).toString('latin1') === 'ustar') return 'pglite';
  if (bytes.subarray(0, 5).toString('latin1') === 'PGDMP') return 'postgres';
  return null;
}

export async function restoreDatabase(config: Config, file: string, opts: { force?: boolean; clock?: () => Date } = {}): Promise<RestoreResult> {
  const source = path.resolve(file);
  if (!fs.existsSync(source)) throw new CliError(`${source} does not exist.`);
  const bytes = fs.readFileSync(source);
  const kind = backupKind(bytes);
  const target = config.databaseUrl ? 'postgres' : 'pglite';
  if (!kind) throw new CliError(`${source} is not an Emberline backup (neither a PGlite tarball nor a pg_dump custom-format file).`);
  if (kind !== target) {
    throw new CliError(
      kind === 'pglite'
        ? `${source} is a backup of the embedded database, but DATABASE_URL selects a PostgreSQL server: unset DATABASE_URL to restore it into DATA_DIR.`
        : `${source} is a pg_dump of a PostgreSQL server, but DATABASE_URL is not set: set it to the server to restore into.`,
    );
  }

  if (config.databaseUrl) {
    const client = new pg.Client({ connectionString: config.databaseUrl });
    await client.connect();
    let tables: number;
    try {
      const r = await client.query<{ n: number }>(`select count(*)::int as n from information_schema.tables where table_schema not in ('pg_catalog', 'information_schema')`);
      tables = r.rows[0].n;
    } finally {
      await client.end();
    }
    if (tables > 0 && !opts.force) throw new CliError(`The database at DATABASE_URL has ${tables} tables already: restore into an empty database, or pass --force to replace its contents.`);
    const args = ['--no-owner', '--no-privileges', '--exit-on-error', '--single-transaction', ...(tables > 0 ? ['--clean', '--if-exists'] : []), '--dbname', config.databaseUrl, source];
    try {
      await run('pg_restore', args);
    } catch (err) {
      const e = err as NodeJS.ErrnoException & { stderr?: string };
      throw new CliError(e.code === 'ENOENT' ? 'pg_restore was not found: install the PostgreSQL client tools (apt-get install postgresql-client).' : `pg_restore failed: ${e.stderr?.trim() || e.message}`);
    }
    const database = await openDatabase({ dataDir: config.dataDir, databaseUrl: config.databaseUrl });
    await database.close();
    return { kind: 'postgres' };
  }

  const dir = pgliteDir(config);
  let movedAside: string | undefined;
  if (fs.existsSync(dir) && fs.readdirSync(dir).length > 0) {
    if (!opts.force) throw new CliError(`${dir} is not empty: it holds a database. Pass --force to move it aside (it is kept, renamed) and restore in its place.`);
    if (fs.existsSync(path.join(dir, 'postmaster.pid'))) {
      // Not a refusal: --force was given. Still say it, the server must not be running.
      console.warn(`restore: ${dir} has a postmaster.pid; make sure no server is running on it.`);
    }
    const stamp = (opts.clock?.() ?? new Date()).toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
    movedAside = `${dir}.replaced-${stamp}`;
    fs.renameSync(dir, movedAside);
  }
  fs.mkdirSync(dir, { recursive: true });
  try {
    const loaded = new PGlite({ dataDir: dir, relaxedDurability: false, loadDataDir: new Blob([bytes]) });
    await loaded.query('select 1');
    await loaded.query('CHECKPOINT');
    await loaded.close();
    // Open it as the server does: migrations newer than the backup are applied now.
    const database = await openDatabase({ dataDir: config.dataDir });
    await database.close();
  } catch (err) {
    // Leave no half-restored folder behind; put the old one back.
    fs.rmSync(dir, { recursive: true, force: true });
    if (movedAside) fs.renameSync(movedAside, dir);
    throw new CliError(`The backup could not be loaded: ${(err as Error).message}`);
  }
  return { kind: 'pglite', movedAside };
}

export function parseRestoreArgs(argv: string[]): { file: string; force: boolean } {
  let file: string | undefined;
  let force = false;
  for (const a of argv) {
    if (a === '--force') force = true;
    else if (a.startsWith('--')) throw new CliError(`unknown option ${a}`);
    else if (file) throw new CliError('give one backup file');
    else file = a;
  }
  if (!file) throw new CliError('usage: npm run restore -- FILE [--force]');
  return { file, force };
}

async function main() {
  try {
    const args = parseRestoreArgs(process.argv.slice(2));
    const config = loadConfig();
    const result = await restoreDatabase(config, args.file, { force: args.force });
    console.log(
      result.kind === 'pglite'
        ? `Restored ${path.resolve(args.file)} into ${pgliteDir(config)}${result.movedAside ? ` (the previous database was moved to ${result.movedAside})` : ''}.`
        : `Restored ${path.resolve(args.file)} into the PostgreSQL database at DATABASE_URL.`,
    );
  } catch (err) {
    if (err instanceof CliError || err instanceof ConfigError) {
      console.error(`restore: ${err.message}`);
      process.exit(1);
    }
    throw err;
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) void main();
