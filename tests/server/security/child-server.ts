/**
 * Starts the real server (server/index.ts under tsx's loader, one Node process) as a child process
 * on a free port and a given DATA_DIR, for tests that must kill it the hard way (SIGKILL) or
 * restart it. `node --import tsx` keeps it a single process, so a signal reaches the server itself
 * and not a wrapper.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { freePort, startWithFreePorts } from '../../setup/free-port';

export { freePort };

export const DEMO_PASSWORD = 'emberline-demo';

export type ChildServer = {
  url: string;
  process: ChildProcess;
  output(): string;
  /** Resolves with the exit code or signal once the process is gone. */
  /** Set as soon as kill() is called (before the exit event arrives). */
  killing: boolean;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  kill(signal: NodeJS.Signals): Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
};

export async function startChildServer(opts: { dataDir: string; env?: Record<string, string> }): Promise<ChildServer> {
  return startWithFreePorts((port, smtpPort) => startOn(opts, port, smtpPort));
}

async function startOn(opts: { dataDir: string; env?: Record<string, string> }, port: number, smtpPort: number): Promise<ChildServer> {
  const url = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: process.cwd(),
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATA_DIR: opts.dataDir,
      FAKE_SMTP_PORT: String(smtpPort),
      BASE_URL: url,
      SEED_DEMO: 'true',
      DATABASE_URL: '',
      ...opts.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  child.stdout?.on('data', (d) => (log += d));
  child.stderr?.on('data', (d) => (log += d));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => child.once('exit', (code, signal) => resolve({ code, signal })));
  const started = Date.now();
  const deadline = started + 120_000;
  for (;;) {
    if (child.exitCode !== null || child.signalCode !== null) throw new Error(`server exited (${child.exitCode ?? child.signalCode}):\n${log}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error(`server did not start in time:\n${log}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  if (process.env.EMBERLINE_TEST_VERBOSE) console.log(`child server up in ${Date.now() - started} ms`);
  const server: ChildServer = {
    url,
    process: child,
    output: () => log,
    killing: false,
    exited,
    async kill(signal) {
      server.killing = true;
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      return exited;
    },
  };
  return server;
}

/** Signs in over HTTP and returns the Cookie header value for later requests. */
export async function signInCookie(url: string, email: string, password = DEMO_PASSWORD): Promise<string> {
  const res = await fetch(`${url}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: new URL(url).origin },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}
