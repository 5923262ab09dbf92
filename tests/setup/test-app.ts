/**
 * Test harness for API tests: `createTestApp()` gives a fresh, migrated and seeded database
 * (temporary PGlite; or, with DATABASE_URL set, a fresh database created on that server and
 * dropped afterwards), the local fake SMTP server on a free port, and `createApp(deps)`.
 * Open one per test file (`beforeAll`) — a first PGlite open with migrations takes seconds.
 *
 *   const t = await createTestApp();
 *   const admin = await t.signIn('admin');           // supertest agent with the session cookie
 *   await admin.get('/api/users').expect(200);
 *   await request(t.app).get('/api/users').expect(401);
 *   await t.close();
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import pg from 'pg';
import request from 'supertest';
import { createApp } from '../../server/app';
import { loadConfig, type Config } from '../../server/config/env';
import { createAppDeps, type AppDeps } from '../../server/context';
import { openDatabase, type Database } from '../../server/db/client';
import { DEMO_PASSWORD, DEMO_USERS, runSeed, type SeedStep } from '../../server/db/seed';
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fake-smtp';
import { createMailer } from '../../server/mail/mailer';
import type { Logger } from '../../server/logger';
import type { Role } from '../../shared/schemas/roles';

export type LogEntry = { level: 'info' | 'warn' | 'error'; message: string; data?: Record<string, unknown> };

export type TestApp = {
  app: Express;
  deps: AppDeps;
  config: Config;
  database: Database;
  smtp: FakeSmtp;
  dataDir: string;
  /** Origin header value better-auth accepts (the configured base URL's origin). */
  origin: string;
  /** Everything the app logged (the logger is otherwise silent). */
  logs: LogEntry[];
  /** An agent signed in as the demo user of that role. */
  signIn(role: Role): Promise<InstanceType<typeof request.agent>>;
  /** An agent signed in with any e-mail and password (fails the test if sign-in fails). */
  signInAs(email: string, password: string): Promise<InstanceType<typeof request.agent>>;
  /** A fresh agent without a session that sends the Origin header. */
  agent(): InstanceType<typeof request.agent>;
  close(): Promise<void>;
};

export type TestAppOptions = {
  /** Extra environment for loadConfig (e.g. { SIGNUP_ENABLED: 'true' }). */
  env?: Record<string, string>;
  /** Seed the demo scenario (default true). */
  seed?: boolean;
  /** Seed steps to run instead of the full demo scenario. */
  seedSteps?: SeedStep[];
  clock?: () => Date;
  /** Reuse a data folder (e.g. to test a restart); it is then not deleted by close(). */
  dataDir?: string;
  /**
   * With DATABASE_URL: keep the scratch database on close() so that the next createTestApp with the
   * same `dataDir` reopens it (its URL is kept in `<dataDir>/test-database-url`).
   */
  keepDatabase?: boolean;
};

export async function createTestApp(opts: TestAppOptions = {}): Promise<TestApp> {
  const ownDataDir = !opts.dataDir;
  const dataDir = opts.dataDir ?? fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-test-'));
  const serverUrl = process.env.DATABASE_URL;
  const scratch = serverUrl ? await scratchDatabaseFor(serverUrl, opts.dataDir) : null;

  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, PUBLIC_URL: 'http://localhost:3000', SEED_DEMO: 'true', ...opts.env, ...(scratch ? { DATABASE_URL: scratch.url } : {}) });
  const logs: LogEntry[] = [];
  const logger: Logger = {
    info: (message, data) => logs.push({ level: 'info', message, data }),
    warn: (message, data) => logs.push({ level: 'warn', message, data }),
    error: (message, data) => logs.push({ level: 'error', message, data }),
  };

  const database = await openDatabase({ dataDir, databaseUrl: config.databaseUrl, logger });
  const smtp = await startFakeSmtp({ port: 0, mailboxDir: path.join(dataDir, 'mailbox') });
  const mailer = createMailer({ from: config.mailFrom, fakePort: smtp.port });
  const deps = createAppDeps({ config, database, mailer, logger, clock: opts.clock });
  if (opts.seed ?? true) await runSeed(deps, opts.seedSteps);
  const app = createApp(deps);
  const origin = new URL(config.baseUrl).origin;

  const agent = () => request.agent(app).set('Origin', origin);
  const signInAs = async (email: string, password: string) => {
    const a = agent();
    const res = await a.post('/api/auth/sign-in/email').send({ email, password });
    if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return a;
  };

  return {
    app,
    deps,
    config,
    database,
    smtp,
    dataDir,
    origin,
    logs,
    agent,
    signInAs,
    signIn(role) {
      const u = DEMO_USERS.find((d) => d.role === role);
      if (!u) throw new Error(`no demo user with role ${role}`);
      return signInAs(u.email, DEMO_PASSWORD);
    },
    async close() {
      await deps.outbox.stop();
      await deps.tasks.stop();
      mailer.close();
      await smtp.stop();
      await database.close();
      if (scratch && !opts.keepDatabase) await scratch.drop();
      if (ownDataDir) fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/**
 * CREATE DATABASE with a random name on the server of `url`; `drop()` removes it. With a given
 * data folder that already names one (a restart test), that database is reused.
 */
async function scratchDatabaseFor(url: string, dataDir?: string): Promise<{ url: string; drop(): Promise<void> }> {
  const marker = dataDir ? path.join(dataDir, 'test-database-url') : null;
  let scratchUrl: URL;
  if (marker && fs.existsSync(marker)) {
    scratchUrl = new URL(fs.readFileSync(marker, 'utf8').trim());
  } else {
    const fresh = `emberline_test_${crypto.randomBytes(6).toString('hex')}`;
    const admin = new pg.Client({ connectionString: url });
    await admin.connect();
    try {
      await admin.query(`CREATE DATABASE ${fresh}`);
    } finally {
      await admin.end();
    }
    scratchUrl = new URL(url);
    scratchUrl.pathname = `/${fresh}`;
    if (marker) fs.writeFileSync(marker, scratchUrl.toString());
  }
  const name = scratchUrl.pathname.slice(1);
  return {
    url: scratchUrl.toString(),
    async drop() {
      if (marker) fs.rmSync(marker, { force: true });
      const c = new pg.Client({ connectionString: url });
      await c.connect();
      try {
        await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      } finally {
        await c.end();
      }
    },
  };
}
