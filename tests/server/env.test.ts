import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ConfigError, isLoopback, loadConfig } from '../../server/config/env';
import { resolveAuthSecret } from '../../server/auth/secret';

describe('loadConfig', () => {
  it('when nothing is set, then the documented defaults', () => {
    const c = loadConfig({}, '/srv/app');
    expect(c).toMatchObject({
      nodeEnv: 'development',
      port: 3000,
      host: '127.0.0.1',
      dataDir: '/srv/app/data',
      databaseUrl: undefined,
      baseUrl: 'http://localhost:3000',
      smtp: undefined,
      fakeSmtpPort: 2525,
      signupEnabled: false,
      seedDemo: true,
      monteCarloNice: 10,
    });
  });

  it('when MONTE_CARLO_NICE is set, then it is taken (0–19); under NODE_ENV=test it defaults to 0; anything else is named', () => {
    expect(loadConfig({ MONTE_CARLO_NICE: '19' }).monteCarloNice).toBe(19);
    expect(loadConfig({ MONTE_CARLO_NICE: '0' }).monteCarloNice).toBe(0);
    expect(loadConfig({ NODE_ENV: 'test' }).monteCarloNice).toBe(0);
    expect(() => loadConfig({ MONTE_CARLO_NICE: '20' })).toThrow(/MONTE_CARLO_NICE must be a whole number from 0 .* to 19/);
    expect(() => loadConfig({ MONTE_CARLO_NICE: 'low' })).toThrow(/MONTE_CARLO_NICE/);
  });

  it('when HOST is set, then the server listens there; loopback addresses are told apart (RFC 1122 §3.2.1.3, RFC 4291 §2.5.3)', () => {
    expect(loadConfig({ HOST: '0.0.0.0' }).host).toBe('0.0.0.0');
    for (const h of ['127.0.0.1', '127.1.2.3', '::1', 'localhost']) expect(isLoopback(h)).toBe(true);
    for (const h of ['0.0.0.0', '::', '10.0.0.5', '128.0.0.1', 'lab.example.org']) expect(isLoopback(h)).toBe(false);
  });

  it('when PORT is set and no URL, then the base URL follows the port', () => {
    expect(loadConfig({ PORT: '8080' }).baseUrl).toBe('http://localhost:8080');
  });

  it('when BASE_URL or PUBLIC_URL is set, then it wins, without a trailing slash', () => {
    expect(loadConfig({ BASE_URL: 'https://lab.example.org/' }).baseUrl).toBe('https://lab.example.org');
    expect(loadConfig({ PUBLIC_URL: 'https://lab.example.org' }).baseUrl).toBe('https://lab.example.org');
  });

  it('when SMTP_HOST is set, then a real SMTP server is configured', () => {
    const c = loadConfig({ SMTP_HOST: 'smtp.example.org', SMTP_PORT: '465', SMTP_SECURE: 'true', SMTP_USER: 'u', SMTP_PASS: 'p' });
    expect(c.smtp).toEqual({ host: 'smtp.example.org', port: 465, secure: true, user: 'u', pass: 'p' });
  });

  it('when several variables are wrong, then one error lists every problem', () => {
    let error: unknown;
    try {
      loadConfig({ PORT: 'eighty', SIGNUP_ENABLED: 'maybe', DATABASE_URL: 'mysql://x', BASE_URL: 'localhost', NODE_ENV: 'staging', AUTH_SECRET: 'short' });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ConfigError);
    const problems = (error as ConfigError).problems.join('\n');
    for (const name of ['PORT', 'SIGNUP_ENABLED', 'DATABASE_URL', 'BASE_URL', 'NODE_ENV', 'AUTH_SECRET']) expect(problems).toContain(name);
    expect((error as ConfigError).problems).toHaveLength(6);
  });

  it('when SMTP credentials are given without a host, then that is named', () => {
    expect(() => loadConfig({ SMTP_USER: 'u', SMTP_PASS: 'p' })).toThrow(/SMTP_HOST must be set/);
  });
});

describe('resolveAuthSecret', () => {
  it('when none is given, then one is generated once, kept with mode 0600 and reused', () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-secret-'));
    try {
      const first = resolveAuthSecret({ dataDir: dir });
      expect(first.length).toBeGreaterThanOrEqual(32);
      expect(fs.statSync(path.join(dir, 'auth-secret')).mode & 0o777).toBe(0o600);
      expect(resolveAuthSecret({ dataDir: dir })).toBe(first);
      expect(resolveAuthSecret({ dataDir: dir, authSecret: 'x'.repeat(40) })).toBe('x'.repeat(40));
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
