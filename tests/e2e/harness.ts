/**
 * Browser-test harness: starts the built server (dist/server/index.js) as a child process on a
 * free port with a fresh DATA_DIR, and drives Debian's chromium with playwright-core. Every
 * request the page makes is recorded so a test can assert that nothing leaves localhost.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { freePort, startWithFreePorts } from '../setup/free-port';

export { freePort };

export const DEMO_PASSWORD = 'emberline-demo';

export interface RunningServer {
  url: string;
  port: number;
  dataDir: string;
  process: ChildProcess;
  output: () => string;
  stop(signal?: NodeJS.Signals): Promise<void>;
}

export async function startServer(opts: { dataDir?: string; env?: Record<string, string>; /** How long to wait for /api/health (default 90 s). */ startTimeoutMs?: number } = {}): Promise<RunningServer> {
  const dataDir = opts.dataDir ?? mkdtempSync(join(tmpdir(), 'emberline-e2e-'));
  mkdirSync(dataDir, { recursive: true });
  return startWithFreePorts((port, smtpPort) => startOn(opts, dataDir, port, smtpPort));
}

async function startOn(opts: { env?: Record<string, string>; startTimeoutMs?: number }, dataDir: string, port: number, smtpPort: number): Promise<RunningServer> {
  const child = spawn(process.execPath, ['dist/server/index.js'], {
    cwd: process.cwd(),
    env: { ...process.env, NODE_ENV: 'production', PORT: String(port), DATA_DIR: dataDir, FAKE_SMTP_PORT: String(smtpPort), BASE_URL: `http://localhost:${port}`, ...opts.env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  child.stdout?.on('data', (d) => (log += d));
  child.stderr?.on('data', (d) => (log += d));
  const url = `http://localhost:${port}`;
  const deadline = Date.now() + (opts.startTimeoutMs ?? 240_000);
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited with ${child.exitCode}:\n${log}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) throw new Error(`server did not start in time:\n${log}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  return {
    url,
    port,
    dataDir,
    process: child,
    output: () => log,
    async stop(signal: NodeJS.Signals = 'SIGTERM') {
      // Keep the server's own log beside the screenshots, for reading after a failure.
      mkdirSync('test-results/logs', { recursive: true });
      writeFileSync(join('test-results/logs', `server-${port}.log`), log);
      if (child.exitCode !== null) return;
      const exited = new Promise((r) => child.once('exit', r));
      child.kill(signal);
      await exited;
    },
  };
}

export interface Browser {
  context: BrowserContext;
  page: Page;
  /** Every URL the browser requested. */
  requests: string[];
  /** Console errors and page errors seen. */
  errors: string[];
  /** Requests that got no answer at all (connection refused or reset, aborted), with the reason. */
  failedRequests: string[];
  close(): Promise<void>;
}

export async function openBrowser(): Promise<Browser> {
  const profile = mkdtempSync(join(tmpdir(), 'emberline-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1366, height: 900 },
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const requests: string[] = [];
  const errors: string[] = [];
  const failedRequests: string[] = [];
  context.on('request', (r) => requests.push(r.url()));
  context.on('requestfailed', (r) => failedRequests.push(`${new Date().toISOString()} ${r.method()} ${r.url()}: ${r.failure()?.errorText ?? 'failed'}`));
  const page = context.pages()[0] ?? (await context.newPage());
  page.on('console', (m) => {
    // The location names the resource behind a "Failed to load resource" message.
    if (m.type() === 'error') errors.push(`${m.text()} [${m.location().url}]`);
  });
  page.on('pageerror', (e) => errors.push(String(e)));
  return {
    context,
    page,
    requests,
    errors,
    failedRequests,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Signs in through the real sign-in page (cookies cleared first) and waits for the app. */
export async function signIn(browser: Browser, url: string, email: string, password = DEMO_PASSWORD): Promise<void> {
  const { page, context } = browser;
  await context.clearCookies();
  await page.goto(`${url}/sign-in`);
  await page.getByLabel(/e-mail/i).fill(email);
  await page.getByLabel(/password/i).fill(password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL(/\/app\//, { timeout: 30_000 });
}

/** True when every URL is on this machine (localhost, 127.0.0.0/8, [::1]) or a data:/blob: URL. */
export function isLocal(url: string): boolean {
  if (url.startsWith('data:') || url.startsWith('blob:') || url.startsWith('about:')) return true;
  const host = new URL(url).hostname;
  return host === 'localhost' || host === '[::1]' || host === '::1' || /^127\./.test(host);
}

export function screenshotPath(name: string): string {
  mkdirSync('test-results/screenshots', { recursive: true });
  return join('test-results/screenshots', `${name}.png`);
}

/**
 * Fills the new-job form (already open) for the demo customer Brightwater Glassworks: the item
 * (by its label, or the first one), the measurement model (its option label), the dates and the
 * laboratory conditions of the demo scenario. The form is left filled, not submitted.
 */
export async function fillNewJob(page: Page, opts: { item?: string; model: string }): Promise<void> {
  // The jobs list has a "Customer" filter too: until the router has shown the new-job page, a
  // combobox named "Customer" is that filter. Choosing there (seen under load in CI) filtered the
  // list and left the form's customer empty when it appeared. Wait for the form's own heading.
  await page.getByRole('heading', { name: 'New calibration job' }).waitFor();
  const form = page.locator('main form');
  const customer = form.getByRole('combobox', { name: /^Customer/ });
  const item = form.getByRole('combobox', { name: /^Item to calibrate/ });
  await customer.selectOption({ label: 'Brightwater Glassworks Ltd (demo)' });
  await (opts.item ? item.selectOption({ label: opts.item }) : item.selectOption({ index: 1 }));
  await form.getByRole('combobox', { name: /^Measurement model/ }).selectOption({ label: opts.model });
  await page.getByLabel('Received on').fill('2026-11-27');
  await page.getByLabel('Calibrated on').fill('2026-12-01');
  await page.getByLabel('Location', { exact: true }).fill('Laboratory room 2');
  await page.getByLabel('Temperature / °C').fill('23.1');
  await page.getByLabel('u(temperature) / °C').fill('0.3');
  await page.getByLabel('Relative humidity / %').fill('41');
}

