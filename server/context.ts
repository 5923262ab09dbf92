import type { Config } from './config/env';
import type { Database } from './db/client';
import { createAuth, type Auth } from './auth/auth';
import { resolveAuthSecret } from './auth/secret';
import { createSessionCache, type SessionCache } from './auth/session-cache';
import type { Mailer } from './mail/mailer';
import { createOutbox, type Outbox } from './mail/outbox';
import type { Logger } from './logger';
import { createTaskRunner, type TaskRunner } from './tasks';

/**
 * Everything the app needs from outside, built once in server/index.ts (or tests/setup/test-app.ts)
 * and passed to createApp. Modules take what they need from here; nothing reaches for globals.
 */
export type AppDeps = {
  config: Config;
  database: Database;
  auth: Auth;
  /** Recent session look-ups of this instance (server/auth/session-cache.ts). */
  sessionCache: SessionCache;
  mailer: Mailer;
  outbox: Outbox;
  /** The time; injectable so tests can move it. */
  clock: () => Date;
  logger: Logger;
  /** Background tasks (Monte Carlo, certificate PDFs): in-process pool or the durable queue (server/tasks). */
  tasks: TaskRunner;
};

/** Builds AppDeps around an open database and a mailer. */
export function createAppDeps(opts: {
  config: Config;
  database: Database;
  mailer: Mailer;
  logger: Logger;
  clock?: () => Date;
}): AppDeps {
  const offsetMs = opts.config.clockOffsetDays * 86_400_000;
  // EMBERLINE_CLOCK_OFFSET_DAYS (browser tests): the whole server sees a moved "now".
  const clock = opts.clock ?? (offsetMs ? () => new Date(Date.now() + offsetMs) : () => new Date());
  if (offsetMs && !opts.clock) opts.logger.warn('EMBERLINE_CLOCK_OFFSET_DAYS is set: the clock is moved (for tests only)', { days: opts.config.clockOffsetDays });
  const auth = createAuth({
    config: opts.config,
    db: opts.database.db,
    secret: resolveAuthSecret({ authSecret: opts.config.authSecret, dataDir: opts.config.dataDir }),
  });
  const outbox = createOutbox({
    db: opts.database.db,
    mailer: opts.mailer,
    clock,
    logger: opts.logger,
    dataDir: opts.config.dataDir,
    messageIdDomain: new URL(opts.config.baseUrl).hostname || 'emberline.invalid',
  });
  const tasks = createTaskRunner({ config: opts.config, database: opts.database, logger: opts.logger });
  const sessionCache = createSessionCache(opts.config.sessionCacheMs);
  return { config: opts.config, database: opts.database, auth, sessionCache, mailer: opts.mailer, outbox, clock, logger: opts.logger, tasks };
}
