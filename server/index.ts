import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { ConfigError, isLoopback, loadConfig } from './config/env';
import { openDatabase } from './db/client';
import { runSeed, DEMO_PASSWORD, DEMO_USERS } from './db/seed';
import { createApp } from './app';
import { createAppDeps } from './context';
import { startFakeSmtp, type FakeSmtp } from './mail/fake-smtp';
import { createMailer } from './mail/mailer';
import { consoleLogger as logger } from './logger';
import { ROLE_LABELS } from '../shared/schemas/roles';
import { labSigningIdentity } from './modules/certificates/lab-identity';
import { createLabRepository } from './modules/lab/lab.repository';

// Start-up: configuration → database (migrated) → demo seed → mail → app → listen.
async function main() {
  let config;
  try {
    config = loadConfig();
  } catch (err) {
    if (err instanceof ConfigError) {
      console.error(err.message);
      process.exit(1);
    }
    throw err;
  }

  const database = await openDatabase({ dataDir: config.dataDir, databaseUrl: config.databaseUrl, logger });
  let fakeSmtp: FakeSmtp | null = null;
  if (!config.smtp) {
    fakeSmtp = await startFakeSmtp({ port: config.fakeSmtpPort, mailboxDir: path.join(config.dataDir, 'mailbox') }).catch((err) =>
      failOnBusyPort(err, config.fakeSmtpPort, 'FAKE_SMTP_PORT'),
    );
  }
  const mailer = createMailer({ from: config.mailFrom, smtp: config.smtp, fakePort: fakeSmtp?.port });
  const deps = createAppDeps({ config, database, mailer, logger });
  if (config.seedDemo) await runSeed(deps);
  // The certificate signing identity: a configured P12, or the self-signed one made on first start.
  const signing = await labSigningIdentity(config, (await createLabRepository(database.db).get()).name);

  const app = createApp(deps, { clientDir: path.resolve(process.cwd(), 'dist/client') });
  const server = app.listen(config.port, config.host);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  }).catch((err) => failOnBusyPort(err, config.port, 'PORT'));
  deps.outbox.start();
  await deps.tasks.start();

  const port = (server.address() as AddressInfo).port;
  const lines = [
    '',
    `Emberline is running: ${config.baseUrl}${port !== config.port ? ` (listening on port ${port})` : ''}`,
    `  database: ${database.kind === 'pglite' ? `embedded PGlite in ${path.join(config.dataDir, 'pglite')}` : 'PostgreSQL (DATABASE_URL)'}`,
    `  tasks:    ${deps.tasks.mode === 'durable' ? 'durable queue in PostgreSQL (pg-boss), shared by every instance on this database' : 'in-process worker pool'}`,
    `  mail:     ${fakeSmtp ? `local fake SMTP on 127.0.0.1:${fakeSmtp.port}, messages kept in ${path.join(config.dataDir, 'mailbox')}` : `SMTP ${config.smtp!.host}:${config.smtp!.port}`}`,
  ];
  lines.push(`  signing:  ${signing.subject} (${signing.source === 'configured' ? 'SIGNING_P12_PATH' : 'self-signed, in ' + path.join(config.dataDir, 'signing')}), certificate SHA-256 ${signing.fingerprint.slice(0, 16)}…`);
  lines.push(`  listens:  ${config.host}:${port}${isLoopback(config.host) ? ' (this machine only; set HOST=0.0.0.0 to serve the network)' : ''}`);
  if (config.seedDemo) {
    lines.push(`  demo sign-ins (password "${DEMO_PASSWORD}"):`);
    for (const u of DEMO_USERS) lines.push(`    ${ROLE_LABELS[u.role].padEnd(22)} ${u.email}`);
    if (!isLoopback(config.host)) {
      logger.warn(`the demo accounts, whose password is published, can be reached from other machines (HOST=${config.host}); set SEED_DEMO=false for a lab's own data`);
    }
  }
  console.log(lines.join('\n') + '\n');

  let closing = false;
  const shutdown = async (signal: string) => {
    if (closing) return;
    closing = true;
    logger.info(`${signal}: shutting down`);
    const force = setTimeout(() => process.exit(1), 10_000);
    force.unref();
    server.closeIdleConnections();
    await new Promise<void>((resolve) => server.close(() => resolve()));
    await deps.outbox.stop();
    await deps.tasks.stop();
    mailer.close();
    await fakeSmtp?.stop();
    await database.close();
    process.exit(0);
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
}

function failOnBusyPort(err: unknown, port: number, variable: string): never {
  if ((err as NodeJS.ErrnoException).code === 'EADDRINUSE') {
    console.error(`Port ${port} is already in use (another Emberline running?). Stop it, or set ${variable} to a free port.`);
    process.exit(1);
  }
  throw err;
}

main().catch((err) => {
  logger.error('start-up failed', { error: err });
  process.exit(1);
});
