/**
 * Web protections (issue 8): security headers with a strict Content-Security-Policy (helmet),
 * a limit on failed sign-ins (express-rate-limit), session cookie flags, and better-auth's origin
 * check on state-changing auth requests.
 * Sources: OWASP ASVS 4.0 V14.4 (HTTP security headers: CSP, nosniff, HSTS, Referrer-Policy,
 * frame-ancestors), V2.2.1 (anti-automation on authentication), V3.4.1–V3.4.3 (cookie Secure,
 * HttpOnly, SameSite), V13.2.3/V4.2.2 (CSRF defence); RFC 6265 §4.1.2.5–§4.1.2.6 (Secure,
 * HttpOnly), RFC 6265bis §4.1.2.7 (SameSite), RFC 6797 (HSTS); W3C CSP Level 3.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../../shared/schemas/api-error.schema';
import { DEMO_PASSWORD } from '../../../server/db/seed';
import { createTestApp, type TestApp } from '../../setup/test-app';

const ADMIN = 'admin@emberline-demo.test';

function directives(csp: string | undefined): Map<string, string[]> {
  const m = new Map<string, string[]>();
  for (const part of (csp ?? '').split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) m.set(name, values);
  }
  return m;
}

describe('security headers', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ seed: false });
  });
  afterAll(() => t?.close());

  for (const url of ['/', '/sign-in', '/api/health', '/api/no-such-route']) {
    it(`when ${url} is fetched, then it carries a strict CSP and the other helmet headers`, async () => {
      const res = await request(t.app).get(url);
      const csp = directives(res.headers['content-security-policy']);
      expect(csp.get('default-src')).toEqual(["'self'"]);
      // No inline or eval'd script anywhere: the main XSS defence in depth.
      expect(csp.get('script-src')).toEqual(["'self'"]);
      expect(csp.get('object-src')).toEqual(["'none'"]);
      expect(csp.get('base-uri')).toEqual(["'self'"]);
      expect(csp.get('form-action')).toEqual(["'self'"]);
      expect(csp.get('frame-ancestors')).toEqual(["'self'"]);
      expect(csp.get('connect-src')).toEqual(["'self'"]);
      for (const [name, values] of csp) {
        expect(values, name).not.toContain("'unsafe-eval'");
        expect(values.some((v) => v === '*' || v === 'http:' || v === 'https:'), name).toBe(false);
      }
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
      expect(res.headers['referrer-policy']).toBe('no-referrer');
      expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
      expect(res.headers['x-powered-by']).toBeUndefined();
      // Over plain http there is no HSTS (it would pin a name that is not served over TLS).
      expect(res.headers['strict-transport-security']).toBeUndefined();
    });
  }
});

describe('sign-in rate limit', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ env: { SIGN_IN_RATE_LIMIT: '3', SIGN_IN_RATE_WINDOW_MINUTES: '15' } });
  });
  afterAll(() => t?.close());

  it('when correct sign-ins repeat, then they are not counted', async () => {
    for (let i = 0; i < 5; i++) await t.agent().post('/api/auth/sign-in/email').send({ email: ADMIN, password: DEMO_PASSWORD }).expect(200);
  });

  it('when failed sign-ins reach the limit, then the address gets 429 in the envelope, also with the right password', async () => {
    for (let i = 0; i < 3; i++) await t.agent().post('/api/auth/sign-in/email').send({ email: ADMIN, password: 'wrong-password-guess' }).expect(401);
    const limited = await t.agent().post('/api/auth/sign-in/email').send({ email: ADMIN, password: 'wrong-password-guess' }).expect(429);
    expect(apiErrorSchema.parse(limited.body).error.code).toBe('TOO_MANY_REQUESTS');
    expect(limited.headers['retry-after']).toBeDefined();
    const evenRight = await t.agent().post('/api/auth/sign-in/email').send({ email: ADMIN, password: DEMO_PASSWORD }).expect(429);
    expect(evenRight.headers['set-cookie']).toBeUndefined();
    // Other API routes are not affected.
    await request(t.app).get('/api/health').expect(200);
  });

  it('when SIGN_IN_RATE_LIMIT is not a positive whole number, then the configuration is refused', async () => {
    const { loadConfig } = await import('../../../server/config/env');
    expect(() => loadConfig({ SIGN_IN_RATE_LIMIT: '0' })).toThrow(/SIGN_IN_RATE_LIMIT/);
    expect(() => loadConfig({ SIGN_IN_RATE_WINDOW_MINUTES: 'soon' })).toThrow(/SIGN_IN_RATE_WINDOW_MINUTES/);
    expect(loadConfig({}).signInRateLimit).toEqual({ limit: 10, windowMs: 15 * 60_000 });
  });
});

describe('client address (rate limits and the sessions list)', () => {
  // Express 5 documentation, "Express behind proxies": without trust proxy, req.ip is the peer
  // and X-Forwarded-For is ignored; with it, the address the trusted proxy reports.
  // OWASP ASVS 4.0 V2.2.1 (a limiter keyed by an address the client chooses is no limiter).
  let direct: TestApp;
  let proxied: TestApp;
  beforeAll(async () => {
    direct = await createTestApp();
    proxied = await createTestApp({ env: { TRUST_PROXY: 'loopback' } });
  });
  afterAll(async () => {
    await direct?.close();
    await proxied?.close();
  });

  const signInFrom = async (t: TestApp, headers: Record<string, string>) => {
    const res = await t.agent().post('/api/auth/sign-in/email').set(headers).send({ email: ADMIN, password: DEMO_PASSWORD }).expect(200);
    const [row] = await t.database.query<{ ip_address: string | null }>('SELECT ip_address FROM "session" WHERE token = $1', [res.body.token]);
    return row?.ip_address;
  };

  it('when no proxy is trusted, then the session records the connection peer, whatever X-Forwarded-For or the internal header say', async () => {
    const ip = await signInFrom(direct, { 'X-Forwarded-For': '203.0.113.9', 'X-Emberline-Client-Address': '198.51.100.7' });
    expect(ip).toMatch(/^(::ffff:)?127\.0\.0\.1$|^::1$/);
  });

  it('when the load balancer is trusted (TRUST_PROXY), then the session records the address it reports', async () => {
    expect(await signInFrom(proxied, { 'X-Forwarded-For': '203.0.113.9' })).toBe('203.0.113.9');
  });

  it('when TRUST_PROXY is not understood, then the configuration is refused naming it', async () => {
    const { loadConfig } = await import('../../../server/config/env');
    expect(() => loadConfig({ TRUST_PROXY: 'everyone' })).toThrow(/TRUST_PROXY.*"everyone"/);
    expect(() => loadConfig({ TRUST_PROXY: '10.0.0.0/33' })).toThrow(/TRUST_PROXY/);
    expect(loadConfig({}).trustProxy).toBe(false);
    expect(loadConfig({ TRUST_PROXY: '1' }).trustProxy).toBe(1);
    expect(loadConfig({ TRUST_PROXY: '10.0.0.5, 10.1.0.0/16' }).trustProxy).toBe('10.0.0.5,10.1.0.0/16');
  });
});

describe('session cookie flags and origin check', () => {
  let http: TestApp;
  let https: TestApp;
  beforeAll(async () => {
    http = await createTestApp();
    https = await createTestApp({ env: { PUBLIC_URL: 'https://lab.example.org' } });
  });
  afterAll(async () => {
    await http?.close();
    await https?.close();
  });

  const sessionCookie = (res: request.Response) => {
    const all = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
    const c = all.find((s) => /session_token=/.test(s.split(';')[0]));
    if (!c) throw new Error(`no session cookie in ${JSON.stringify(all)}`);
    return { name: c.split('=')[0], attrs: c.split(';').slice(1).map((a) => a.trim().toLowerCase()) };
  };

  it('when signing in over http, then the session cookie is HttpOnly, SameSite=Lax, Path=/ and not Secure', async () => {
    const res = await http.agent().post('/api/auth/sign-in/email').send({ email: ADMIN, password: DEMO_PASSWORD }).expect(200);
    const c = sessionCookie(res);
    expect(c.attrs).toContain('httponly');
    expect(c.attrs).toContain('samesite=lax');
    expect(c.attrs).toContain('path=/');
    expect(c.attrs).not.toContain('secure');
  });

  it('when BASE_URL is https, then the session cookie is also Secure with the __Secure- prefix, and HSTS is sent', async () => {
    const res = await https.agent().post('/api/auth/sign-in/email').send({ email: ADMIN, password: DEMO_PASSWORD }).expect(200);
    const c = sessionCookie(res);
    expect(c.name.startsWith('__Secure-')).toBe(true);
    expect(c.attrs).toContain('secure');
    expect(c.attrs).toContain('httponly');
    expect(c.attrs).toContain('samesite=lax');
    const page = await request(https.app).get('/api/health');
    expect(page.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    expect(directives(page.headers['content-security-policy']).has('upgrade-insecure-requests')).toBe(true);
  });

  it('when a sign-in comes from a foreign Origin or Referer, or without Origin from a browser, then better-auth refuses it and sets no cookie', async () => {
    for (const origin of ['http://evil.example', 'null', 'http://localhost:3000.evil.example']) {
      const res = await request(http.app).post('/api/auth/sign-in/email').set('Origin', origin).send({ email: ADMIN, password: DEMO_PASSWORD });
      expect(res.status, origin).toBe(403);
      expect(res.headers['set-cookie'], origin).toBeUndefined();
    }
    // Without Origin but carrying cookies (what a browser sends): refused too. A request with
    // neither Origin nor cookies (a script, not a browser) is let through by better-auth: it
    // carries no ambient credential a forged request could abuse.
    const noOrigin = await request(http.app).post('/api/auth/sign-in/email').set('Cookie', 'anything=1').send({ email: ADMIN, password: DEMO_PASSWORD });
    expect(noOrigin.status).toBe(403);
    expect(noOrigin.headers['set-cookie']).toBeUndefined();
    const foreignReferer = await request(http.app).post('/api/auth/sign-in/email').set('Referer', 'http://evil.example/page').send({ email: ADMIN, password: DEMO_PASSWORD });
    expect(foreignReferer.status).toBe(403);
  });

  it('when a signed-in browser is driven to sign out from a foreign Origin, then it is refused', async () => {
    const admin = await http.signIn('admin');
    await admin.post('/api/auth/sign-out').set('Origin', 'http://evil.example').send({}).expect(403);
    await admin.get('/api/me').expect(200);
  });
});
