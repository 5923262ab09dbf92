import net from 'node:net';
import path from 'node:path';
import { z } from 'zod';

/**
 * The server's configuration, parsed once from the environment. This module is the only reader
 * of `process.env` on the server; everything else receives a `Config`.
 * Every variable is documented in `.env.example`.
 */

const bool = (name: string, fallback: boolean) =>
  z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v.trim() === '') return fallback;
      const s = v.trim().toLowerCase();
      if (['1', 'true', 'yes', 'on'].includes(s)) return true;
      if (['0', 'false', 'no', 'off'].includes(s)) return false;
      ctx.addIssue({ code: 'custom', message: `${name} must be true or false, got "${v}"` });
      return z.NEVER;
    });

const port = (name: string, fallback: number) =>
  z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v.trim() === '') return fallback;
      const n = Number(v);
      if (!Number.isInteger(n) || n < 0 || n > 65535) {
        ctx.addIssue({ code: 'custom', message: `${name} must be a port number from 0 to 65535, got "${v}"` });
        return z.NEVER;
      }
      return n;
    });

/** A `trust proxy` entry Express (proxy-addr) accepts: an address, address/prefix, or a named range. */
function isProxyEntry(entry: string): boolean {
  if (['loopback', 'linklocal', 'uniquelocal'].includes(entry)) return true;
  const [address, prefix, ...rest] = entry.split('/');
  const family = net.isIP(address);
  if (!family || rest.length > 0) return false;
  if (prefix === undefined) return true;
  return /^\d+$/.test(prefix) && Number(prefix) <= (family === 4 ? 32 : 128);
}

const positiveInt = (name: string, fallback: number, max: number) =>
  z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v.trim() === '') return fallback;
      const n = Number(v);
      if (!Number.isInteger(n) || n < 1 || n > max) {
        ctx.addIssue({ code: 'custom', message: `${name} must be a whole number from 1 to ${max}, got "${v}"` });
        return z.NEVER;
      }
      return n;
    });

const optionalText = z
  .string()
  .optional()
  .transform((v) => (v === undefined || v.trim() === '' ? undefined : v.trim()));

const url = (name: string) =>
  optionalText.refine((v) => v === undefined || /^https?:\/\/[^\s/]+/.test(v), {
    message: `${name} must be an http:// or https:// URL`,
  });

const envSchema = z.object({
  NODE_ENV: z
    .enum(['development', 'production', 'test'], { error: 'NODE_ENV must be development, production or test' })
    .optional()
    .default('development'),
  PORT: port('PORT', 3000),
  // Loopback by default: the demo accounts' password is printed at start and written in the README,
  // so the server is reachable from other machines only when HOST says so (e.g. 0.0.0.0).
  HOST: optionalText.default('127.0.0.1'),
  DATA_DIR: optionalText.default('./data'),
  DATABASE_URL: optionalText.refine((v) => v === undefined || /^postgres(ql)?:\/\//.test(v), {
    message: 'DATABASE_URL must start with postgres:// or postgresql://',
  }),
  PUBLIC_URL: url('PUBLIC_URL'),
  BASE_URL: url('BASE_URL'),
  AUTH_SECRET: optionalText.refine((v) => v === undefined || v.length >= 32, {
    message: 'AUTH_SECRET must be at least 32 characters (leave it unset to have one generated)',
  }),
  SMTP_HOST: optionalText,
  SMTP_PORT: port('SMTP_PORT', 587),
  SMTP_USER: optionalText,
  SMTP_PASS: optionalText,
  SMTP_SECURE: bool('SMTP_SECURE', false),
  SMTP_FROM: optionalText.default('Emberline <no-reply@emberline-demo.test>'),
  FAKE_SMTP_PORT: port('FAKE_SMTP_PORT', 2525),
  SIGNUP_ENABLED: bool('SIGNUP_ENABLED', false),
  SIGNING_P12_PATH: optionalText,
  SIGNING_P12_PASSPHRASE: z.string().optional(),
  SEED_DEMO: bool('SEED_DEMO', true),
  SIGN_IN_RATE_LIMIT: positiveInt('SIGN_IN_RATE_LIMIT', 10, 100_000),
  SIGN_IN_RATE_WINDOW_MINUTES: positiveInt('SIGN_IN_RATE_WINDOW_MINUTES', 15, 24 * 60),
  TRUST_PROXY: optionalText.transform((v, ctx) => {
    if (v === undefined || v === 'false') return false;
    if (/^\d+$/.test(v)) {
      const hops = Number(v);
      if (hops <= 16) return hops;
    }
    const entries = v.split(',').map((x) => x.trim()).filter(Boolean);
    const bad = entries.filter((x) => !isProxyEntry(x));
    if (entries.length === 0 || bad.length > 0) {
      ctx.addIssue({
        code: 'custom',
        message: `TRUST_PROXY must be false, a number of proxy hops (0–16), or a comma-separated list of proxy addresses or ranges (e.g. 10.0.0.5, 10.1.0.0/16, loopback); not understood: ${bad.map((b) => `"${b}"`).join(', ') || `"${v}"`}`,
      });
      return z.NEVER;
    }
    return entries.join(',');
  }),
  TASK_QUEUE: optionalText
    .refine((v) => v === undefined || ['auto', 'in-process', 'pgboss'].includes(v), { message: 'TASK_QUEUE must be auto, in-process or pgboss' })
    .transform((v) => (v ?? 'auto') as 'auto' | 'in-process' | 'pgboss'),
  TASK_CONCURRENCY: optionalText.transform((v, ctx) => {
    if (v === undefined) return undefined;
    const n = Number(v);
    if (!Number.isInteger(n) || n < 1 || n > 64) {
      ctx.addIssue({ code: 'custom', message: `TASK_CONCURRENCY must be a whole number from 1 to 64, got "${v}"` });
      return z.NEVER;
    }
    return n;
  }),
  SESSION_CACHE_SECONDS: optionalText.transform((v, ctx) => {
    if (v === undefined) return undefined;
    const n = Number(v);
    if (!Number.isInteger(n) || n < 0 || n > 300) {
      ctx.addIssue({ code: 'custom', message: `SESSION_CACHE_SECONDS must be a whole number of seconds from 0 (off) to 300, got "${v}"` });
      return z.NEVER;
    }
    return n;
  }),
  MONTE_CARLO_NICE: optionalText.transform((v, ctx) => {
    if (v === undefined) return undefined;
    const n = Number(v);
    if (!Number.isInteger(n) || n < 0 || n > 19) {
      ctx.addIssue({ code: 'custom', message: `MONTE_CARLO_NICE must be a whole number from 0 (same priority as the API) to 19 (lowest), got "${v}"` });
      return z.NEVER;
    }
    return n;
  }),
  EMBERLINE_CLOCK_OFFSET_DAYS: optionalText.transform((v, ctx) => {
    if (v === undefined) return 0;
    const n = Number(v);
    if (!Number.isFinite(n) || Math.abs(n) > 36500) {
      ctx.addIssue({ code: 'custom', message: `EMBERLINE_CLOCK_OFFSET_DAYS must be a number of days, got "${v}"` });
      return z.NEVER;
    }
    return n;
  }),
});

export type SmtpConfig = {
  host: string;
  port: number;
  secure: boolean;
  user?: string;
  pass?: string;
};

export type Config = {
  nodeEnv: 'development' | 'production' | 'test';
  port: number;
  host: string;
  /** Absolute path of the data folder (database, auth secret, mailbox, files). */
  dataDir: string;
  /** Set: node-postgres against that server. Unset: embedded PGlite under dataDir/pglite. */
  databaseUrl?: string;
  /** The URL people use to reach the app, without a trailing slash. */
  baseUrl: string;
  /** Unset: generated on first start and kept in dataDir/auth-secret (see server/auth/secret.ts). */
  authSecret?: string;
  /** Unset: the local fake SMTP server (server/mail/fake-smtp.ts) receives the mail. */
  smtp?: SmtpConfig;
  mailFrom: string;
  fakeSmtpPort: number;
  signupEnabled: boolean;
  seedDemo: boolean;
  /** Where background tasks run: auto (pgboss with DATABASE_URL, else in-process), in-process, pgboss. */
  taskQueue: 'auto' | 'in-process' | 'pgboss';
  /** Durable queue: tasks of each kind one instance runs at once (unset: half the cores). */
  taskConcurrency?: number;
  /**
   * Express's `trust proxy`: false (the client address is the connection's peer), a number of
   * proxy hops, or the proxies' addresses/ranges; decides `req.ip` (server/security/client-address.ts).
   */
  trustProxy: false | number | string;
  /** Failed sign-ins allowed per client address and window (server/security/rate-limit.ts). */
  signInRateLimit: { limit: number; windowMs: number };
  /**
   * How long a session look-up is remembered per instance (server/auth/session-cache.ts), in ms;
   * 0 off. SESSION_CACHE_SECONDS, default 5 s, and off under NODE_ENV=test unless set.
   */
  sessionCacheMs: number;
  /**
   * Linux nice value of the Monte Carlo worker threads (server/workers/thread-priority.ts), so
   * that long runs yield the processor to API requests. MONTE_CARLO_NICE, default 10, and 0
   * (unchanged) under NODE_ENV=test unless set.
   */
  monteCarloNice: number;
  /** Test-only: the server's clock runs this many days ahead (negative: behind). 0 normally. */
  clockOffsetDays: number;
  /** The lab's own signing P12 (path, passphrase); unset: a self-signed one under dataDir/signing. */
  signing?: { p12Path: string; passphrase: string };
};

export class ConfigError extends Error {
  constructor(readonly problems: string[]) {
    super(`The configuration is not valid:\n${problems.map((p) => `  - ${p}`).join('\n')}`);
    this.name = 'ConfigError';
  }
}

/**
 * Parses the environment. Throws a `ConfigError` listing every problem at once.
 * @param env defaults to `process.env`; tests pass their own object.
 * @param cwd folder that a relative DATA_DIR is resolved against.
 */
export function loadConfig(env: Record<string, string | undefined> = process.env, cwd = process.cwd()): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    throw new ConfigError(
      parsed.error.issues.map((i) => {
        const name = i.path.join('.');
        return i.message.startsWith(name) ? i.message : `${name}: ${i.message}`;
      }),
    );
  }
  const e = parsed.data;
  const problems: string[] = [];
  if (e.SMTP_USER && !e.SMTP_PASS) problems.push('SMTP_PASS must be set when SMTP_USER is set');
  if (!e.SMTP_HOST && (e.SMTP_USER || e.SMTP_PASS)) problems.push('SMTP_HOST must be set when SMTP_USER or SMTP_PASS is set');
  if (e.PUBLIC_URL && e.BASE_URL && e.PUBLIC_URL.replace(/\/+$/, '') !== e.BASE_URL.replace(/\/+$/, '')) {
    problems.push('PUBLIC_URL and BASE_URL name the same thing: set one of them, or the same value in both');
  }
  if (e.SIGNING_P12_PASSPHRASE !== undefined && !e.SIGNING_P12_PATH) problems.push('SIGNING_P12_PATH must be set when SIGNING_P12_PASSPHRASE is set');
  if (e.TASK_QUEUE === 'pgboss' && !e.DATABASE_URL) problems.push('TASK_QUEUE=pgboss needs DATABASE_URL (the queue lives in PostgreSQL)');
  if (problems.length) throw new ConfigError(problems);

  const baseUrl = (e.PUBLIC_URL ?? e.BASE_URL ?? `http://localhost:${e.PORT}`).replace(/\/+$/, '');
  return {
    nodeEnv: e.NODE_ENV,
    port: e.PORT,
    host: e.HOST,
    dataDir: path.resolve(cwd, e.DATA_DIR),
    databaseUrl: e.DATABASE_URL,
    baseUrl,
    authSecret: e.AUTH_SECRET,
    smtp: e.SMTP_HOST
      ? { host: e.SMTP_HOST, port: e.SMTP_PORT, secure: e.SMTP_SECURE, user: e.SMTP_USER, pass: e.SMTP_PASS }
      : undefined,
    mailFrom: e.SMTP_FROM,
    fakeSmtpPort: e.FAKE_SMTP_PORT,
    signupEnabled: e.SIGNUP_ENABLED,
    seedDemo: e.SEED_DEMO,
    trustProxy: e.TRUST_PROXY,
    taskQueue: e.TASK_QUEUE,
    taskConcurrency: e.TASK_CONCURRENCY,
    clockOffsetDays: e.EMBERLINE_CLOCK_OFFSET_DAYS,
    signInRateLimit: { limit: e.SIGN_IN_RATE_LIMIT, windowMs: e.SIGN_IN_RATE_WINDOW_MINUTES * 60_000 },
    sessionCacheMs: (e.SESSION_CACHE_SECONDS ?? (e.NODE_ENV === 'test' ? 0 : 5)) * 1000,
    monteCarloNice: e.MONTE_CARLO_NICE ?? (e.NODE_ENV === 'test' ? 0 : 10),
    signing: e.SIGNING_P12_PATH ? { p12Path: path.resolve(cwd, e.SIGNING_P12_PATH), passphrase: e.SIGNING_P12_PASSPHRASE ?? '' } : undefined,
  };
}

/** True for an address that only this machine can reach: 127.0.0.0/8, ::1 or localhost (RFC 1122 §3.2.1.3, RFC 4291 §2.5.3). */
export function isLoopback(host: string): boolean {
  return host === 'localhost' || host === '::1' || /^127(\.\d{1,3}){3}$/.test(host);
}
