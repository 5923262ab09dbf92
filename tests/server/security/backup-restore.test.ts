/**
 * Backup and restore (issue 8): `npm run backup` then `npm run restore` give back the same
 * records — users, customers, audit rows — with the audit hash chain still verifying, ending at
 * the same hash. Run through the CLI as a user would. Sources: ISO/IEC 17025:2017 §7.5.1 and
 * §8.4.2 (records retained, protected and retrievable); restore refusing to overwrite a database
 * is common practice, no source.
 */
import { execFile } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { verifyAuditChain } from '../../../server/audit';
import { openDatabase, type Database } from '../../../server/db/client';
import { createTestApp } from '../../setup/test-app';

const exec = promisify(execFile);
const serverUrl = process.env.DATABASE_URL;

// vitest sets BASE_URL=/ (Vite's base) in the environment: the CLI must not see it.
async function cli(script: 'backup' | 'restore', args: string[], env: Record<string, string>) {
  try {
    const r = await exec(process.execPath, ['--import', 'tsx', `server/cli/${script}.ts`, ...args], { cwd: process.cwd(), env: { ...process.env, BASE_URL: '', PUBLIC_URL: '', NODE_ENV: 'production', ...env } });
    return { code: 0, stdout: r.stdout, stderr: r.stderr };
  } catch (err) {
    const e = err as { code?: number; stdout?: string; stderr?: string };
    return { code: e.code ?? -1, stdout: e.stdout ?? '', stderr: e.stderr ?? '' };
  }
}

async function snapshot(database: Database) {
  const n = async (sql: string) => (await database.query<{ n: number }>(sql))[0].n;
  const chain = await verifyAuditChain(database.db);
  return {
    users: await n('select count(*)::int as n from "user"'),
    accounts: await n('select count(*)::int as n from account'),
    customers: await n('select count(*)::int as n from customers'),
    audit: await n('select count(*)::int as n from audit_log'),
    chainOk: chain.ok,
    lastHash: chain.lastHash,
  };
}

async function createDatabase(url: string) {
  const name = `emberline_restore_${crypto.randomBytes(5).toString('hex')}`;
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  await c.query(`CREATE DATABASE ${name}`);
  await c.end();
  const u = new URL(url);
  u.pathname = `/${name}`;
  return { url: u.toString(), name };
}

async function dropDatabase(url: string, name: string) {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  await c.end();
}

describe('npm run backup / npm run restore', () => {
  const work = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-backup-'));
  const sourceDir = path.join(work, 'source');
  const targetDir = path.join(work, 'target');
  const backupFile = path.join(work, 'emberline.backup');
  let sourceUrl: string | undefined;
  const dropLater: string[] = [];
  let before: Awaited<ReturnType<typeof snapshot>>;

  beforeAll(async () => {
    fs.mkdirSync(sourceDir);
    const t = await createTestApp({ dataDir: sourceDir, keepDatabase: true });
    const qm = await t.signIn('quality_manager');
    for (let i = 1; i <= 3; i++) await qm.post('/api/customers').send({ organisation: `Backup Test Customer ${i} (demo)` }).expect(201);
    const admin = await t.signIn('admin');
    await admin.post('/api/users').send({ name: 'Backed Up', email: 'backed-up@example.org', role: 'analyst', password: 'a-good-long-password' }).expect(201);
    before = await snapshot(t.database);
    sourceUrl = t.config.databaseUrl;
    if (sourceUrl) dropLater.push(new URL(sourceUrl).pathname.slice(1));
    await t.close();
  });

  afterAll(async () => {
    if (serverUrl) for (const name of dropLater) await dropDatabase(serverUrl, name);
    fs.rmSync(work, { recursive: true, force: true });
  });

  it('when a seeded database is backed up and restored elsewhere, then the counts and the audit chain are the same', async () => {
    expect(before.chainOk).toBe(true);
    expect(before.customers).toBeGreaterThan(3);
    const backup = await cli('backup', ['--out', backupFile], { DATA_DIR: sourceDir, DATABASE_URL: sourceUrl ?? '' });
    expect(backup.stderr).toBe('');
    expect(backup.code).toBe(0);
    expect(backup.stdout).toMatch(/Backup written/);
    expect(fs.statSync(backupFile).size).toBeGreaterThan(0);

    let targetUrl = '';
    if (serverUrl) {
      const fresh = await createDatabase(serverUrl);
      dropLater.push(fresh.name);
      targetUrl = fresh.url;
    }
    const restored = await cli('restore', [backupFile], { DATA_DIR: targetDir, DATABASE_URL: targetUrl });
    expect(restored.stderr).toBe('');
    expect(restored.code).toBe(0);

    const database = await openDatabase({ dataDir: targetDir, databaseUrl: targetUrl || undefined });
    try {
      expect(await snapshot(database)).toEqual(before);
    } finally {
      await database.close();
    }
  });

  it('when the target already holds a database, then restore refuses without --force and replaces it with --force', async () => {
    const env = { DATA_DIR: targetDir, DATABASE_URL: '' };
    if (serverUrl) {
      // Restore into the database restored by the previous test.
      const c = new pg.Client({ connectionString: serverUrl });
      await c.connect();
      const name = dropLater[dropLater.length - 1];
      await c.end();
      const u = new URL(serverUrl);
      u.pathname = `/${name}`;
      env.DATABASE_URL = u.toString();
    }
    const refused = await cli('restore', [backupFile], env);
    expect(refused.code).toBe(1);
    expect(refused.stderr).toMatch(/--force/);

    const forced = await cli('restore', [backupFile, '--force'], env);
    expect(forced.stderr).toBe('');
    expect(forced.code).toBe(0);
    if (!serverUrl) {
      // The replaced database was moved aside, not deleted.
      expect(fs.readdirSync(targetDir).some((n) => n.startsWith('pglite.replaced-'))).toBe(true);
    }
    const database = await openDatabase({ dataDir: targetDir, databaseUrl: env.DATABASE_URL || undefined });
    try {
      expect(await snapshot(database)).toEqual(before);
    } finally {
      await database.close();
    }
  });

  it.skipIf(Boolean(serverUrl))('when the embedded database is open (the server runs), then backup refuses instead of opening it a second time', async () => {
    const t = await createTestApp({ seed: false });
    try {
      const r = await cli('backup', ['--out', path.join(work, 'while-open.backup')], { DATA_DIR: t.dataDir, DATABASE_URL: '' });
      expect(r.code).toBe(1);
      expect(r.stderr).toMatch(/stop the server/);
      expect(fs.existsSync(path.join(work, 'while-open.backup'))).toBe(false);
    } finally {
      await t.close();
    }
  });

  it('when the backup file is not a backup, then restore says so and changes nothing', async () => {
    const junk = path.join(work, 'junk.backup');
    fs.writeFileSync(junk, 'not a backup at all');
    const empty = path.join(work, 'empty-target');
    const r = await cli('restore', [junk], { DATA_DIR: empty, DATABASE_URL: serverUrl ?? '' });
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/not an Emberline backup/);
    expect(fs.existsSync(path.join(empty, 'pglite'))).toBe(false);
  });
});
