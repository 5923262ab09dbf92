/**
 * Back up the database:
 *
 *   npm run backup [-- --out FILE] [--force]
 *
 * Embedded database (no DATABASE_URL): PGlite's `dumpDataDir('gzip')`, a gzipped tar of
 * `DATA_DIR/pglite`, taken after a CHECKPOINT. PGlite has one process at a time on its folder, so
 * stop the server first; a `postmaster.pid` in the folder means it is open (or was not closed
 * cleanly, e.g. after a crash: then start and stop the server once, or pass --force).
 * PostgreSQL server (DATABASE_URL): `pg_dump --format=custom`, which is consistent while the
 * server runs. Either way the file is written under a temporary name, flushed and renamed, so a
 * half-written backup never carries the final name. `npm run restore -- FILE` loads it.
 *
 * Only the database is in the dump. DATA_DIR also holds uploaded files (files/), outbox
 * attachments (outbox/), the signing identity (signing/) and the auth secret: copy those too.
 */
import { execFile } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { promisify } from 'node:util';
import { PGlite } from '@electric-sql/pglite';
import { ConfigError, loadConfig, type Config } from '../config/env';

const run = promisify(execFile);

export class CliError extends Error {}

export type BackupResult = { file: string; bytes: number; kind: 'pglite' | 'postgres'; sha256: string };

/** Writes `bytes` to `file` through a temporary name with fsync, then renames it into place. */
export function writeFileDurably(file: string, bytes: Uint8Array): void {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const tmp = `${file}.${crypto.randomBytes(4).toString('hex')}.partial`;
  const fd = fs.openSync(tmp, 'wx', 0o600);
  try {
    fs.writeSync(fd, bytes);
    fs.fsyncSync(fd);
  } finally {
    fs.closeSync(fd);
  }
  fs.renameSync(tmp, file);
}

export function pgliteDir(config: Pick<Config, 'dataDir'>): string {
  return path.join(config.dataDir, 'pglite');
}

export function defaultBackupName(kind: 'pglite' | 'postgres', now = new Date()): string {
  const stamp = now.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
  return `emberline-backup-${stamp}${kind === 'pglite' ? '.tar.gz' : '.pgdump'}`;
}

export async function backupDatabase(config: Config, opts: { out?: string; force?: boolean } = {}): Promise<BackupResult> {
  const kind = config.databaseUrl ? 'postgres' : 'pglite';
  const file = path.resolve(opts.out ?? defaultBackupName(kind));
  if (fs.existsSync(file)) throw new CliError(`${file} exists already: choose another --out, a backup is never overwritten.`);

  if (config.databaseUrl) {
    const tmp = `${file}.${crypto.randomBytes(4).toString('hex')}.partial`;
    try {
      await run('pg_dump', ['--format=custom', '--no-owner', '--no-privileges', '--file', tmp, '--dbname', config.databaseUrl]);
    } catch (err) {
      fs.rmSync(tmp, { force: true });
      const e = err as NodeJS.ErrnoException & { stderr?: string };
      throw new CliError(e.code === 'ENOENT' ? 'pg_dump was not found: install the PostgreSQL client tools (apt-get install postgresql-client).' : `pg_dump failed: ${e.stderr?.trim() || e.message}`);
    }
    const fd = fs.openSync(tmp, 'r');
    fs.fsyncSync(fd);
    fs.closeSync(fd);
    fs.renameSync(tmp, file);
    const bytes = fs.readFileSync(file);
    return { file, bytes: bytes.length, kind, sha256: crypto.createHash('sha256').update(bytes).digest('hex') };
  }

  const dir = pgliteDir(config);
  if (!fs.existsSync(path.join(dir, 'PG_VERSION'))) throw new CliError(`There is no embedded database in ${dir} (is DATA_DIR right?).`);
  if (fs.existsSync(path.join(dir, 'postmaster.pid')) && !opts.force) {
    throw new CliError(
      `The database in ${dir} is open (postmaster.pid is there): stop the server first — the embedded database allows one process at a time. ` +
        'If no server is running (it was killed), start and stop it once, or pass --force.',
    );
  }
  const pg = new PGlite({ dataDir: dir, relaxedDurability: false });
  try {
    await pg.query('CHECKPOINT');
    const blob = await pg.dumpDataDir('gzip');
    const bytes = new Uint8Array(await blob.arrayBuffer());
    writeFileDurably(file, bytes);
    return { file, bytes: bytes.length, kind, sha256: crypto.createHash('sha256').update(bytes).digest('hex') };
  } finally {
    await pg.close();
  }
}

export function parseBackupArgs(argv: string[]): { out?: string; force: boolean } {
  const args: { out?: string; force: boolean } = { force: false };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--out') {
      args.out = argv[++i];
      if (!args.out) throw new CliError('--out needs a file name.');
    } else if (a === '--force') args.force = true;
    else throw new CliError(`unknown argument ${JSON.stringify(a)}\nusage: npm run backup [-- --out FILE] [--force]`);
  }
  return args;
}

async function main() {
  try {
    const args = parseBackupArgs(process.argv.slice(2));
    const result = await backupDatabase(loadConfig(), args);
    console.log(`Backup written: ${result.file} (${result.bytes} bytes, ${result.kind === 'pglite' ? 'embedded database' : 'pg_dump custom format'}, SHA-256 ${result.sha256})`);
  } catch (err) {
    if (err instanceof CliError || err instanceof ConfigError) {
      console.error(`backup: ${err.message}`);
      process.exit(1);
    }
    throw err;
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) void main();
