import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema';
import { meSchema } from '../../shared/schemas/me.schema';
import { ROLES } from '../../shared/schemas/roles';
import { DEMO_USERS } from '../../server/db/seed';
import { createTestApp, type TestApp } from '../setup/test-app';

describe('sign-in, roles and /api/me (public sign-up off, the default)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t?.close());

  it('when a guarded route is called without a session, then 401 in the envelope', async () => {
    for (const url of ['/api/me', '/api/users', '/api/lab/settings', '/api/customers']) {
      const res = await request(t.app).get(url).expect(401);
      expect(apiErrorSchema.parse(res.body).error.code).toBe('UNAUTHORIZED');
    }
  });

  it('when a session cookie is forged, then 401', async () => {
    const res = await request(t.app).get('/api/me').set('Cookie', 'better-auth.session_token=forged.value').expect(401);
    expect(res.body.error.code).toBe('UNAUTHORIZED');
  });

  it('when the role is wrong, then 403 in the envelope', async () => {
    const analyst = await t.signIn('analyst');
    const res = await analyst.get('/api/users').expect(403);
    expect(apiErrorSchema.parse(res.body).error.code).toBe('FORBIDDEN');
    await analyst.put('/api/lab').send({}).expect(403);
    const customer = await t.signIn('customer');
    await customer.get('/api/customers').expect(403);
  });

  it.each(ROLES)('when %s signs in, then /api/me reports that role', async (role) => {
    const agent = await t.signIn(role);
    const res = await agent.get('/api/me').expect(200);
    const me = meSchema.parse(res.body);
    const demo = DEMO_USERS.find((u) => u.role === role)!;
    expect(me.user).toMatchObject({ email: demo.email, role });
    expect(me.user.customerId === null).toBe(role !== 'customer');
    expect(me.lab.name).toContain('(demo)');
  });

  it('when signing in, then the session cookie is HttpOnly and SameSite=Lax, and not Secure over http', async () => {
    const res = await t.agent().post('/api/auth/sign-in/email').send({ email: 'admin@emberline-demo.test', password: 'emberline-demo' }).expect(200);
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.includes('session_token'));
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/;\s*Secure/i);
  });

  it('when the password is wrong, then sign-in fails and no session is set', async () => {
    const res = await t.agent().post('/api/auth/sign-in/email').send({ email: 'admin@emberline-demo.test', password: 'not-the-password' });
    expect(res.status).toBe(401);
    expect(res.headers['set-cookie'] ?? []).toHaveLength(0);
  });

  it('when sign-in comes from a foreign origin, then better-auth refuses it (origin check on)', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-in/email')
      .set('Origin', 'http://evil.example.com')
      .send({ email: 'admin@emberline-demo.test', password: 'emberline-demo' });
    expect(res.status).toBe(403);
    expect(res.headers['set-cookie'] ?? []).toHaveLength(0);
  });

  it('when a request with the session cookie comes from a foreign origin, then it is refused', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.post('/api/auth/update-user').set('Origin', 'http://evil.example.com').send({ name: 'Renamed' });
    expect(res.status).toBe(403);
    const [row] = await t.database.query<{ name: string }>('select name from "user" where email = $1', ['admin@emberline-demo.test']);
    expect(row.name).toBe('Alex Admin (demo)');
  });

  it('when a sign-up body carries role "admin", then it is refused and no user is created', async () => {
    const res = await t
      .agent()
      .post('/api/auth/sign-up/email')
      .send({ name: 'Intruder', email: 'intruder@example.org', password: 'long-enough-password', role: 'admin' });
    expect(res.status).toBe(400);
    const plain = await t.agent().post('/api/auth/sign-up/email').send({ name: 'Intruder', email: 'intruder@example.org', password: 'long-enough-password' });
    expect(plain.status).toBe(400);
    expect(plain.body.code).toBe('EMAIL_PASSWORD_SIGN_UP_DISABLED');
    const rows = await t.database.query('select role from "user" where email = $1', ['intruder@example.org']);
    expect(rows).toHaveLength(0);
  });

  it('when signing out, then the session no longer works', async () => {
    const agent = await t.signIn('signatory');
    await agent.get('/api/me').expect(200);
    await agent.post('/api/auth/sign-out').send({}).expect(200);
    await agent.get('/api/me').expect(401);
  });
});

describe('with SIGNUP_ENABLED=true', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ env: { SIGNUP_ENABLED: 'true' }, seed: false });
  });
  afterAll(() => t?.close());

  it('when a sign-up body carries role "admin" or a customerId, then better-auth refuses it (input: false)', async () => {
    for (const extra of [{ role: 'admin' }, { customerId: '00000000-0000-4000-8000-000000000000' }]) {
      const res = await t.agent().post('/api/auth/sign-up/email').send({ name: 'Self', email: 'sneaky@example.org', password: 'long-enough-password', ...extra });
      expect(res.status).toBe(400);
      expect(res.body.code).toBe('FIELD_NOT_ALLOWED');
    }
    expect(await t.database.query('select 1 from "user" where email = $1', ['sneaky@example.org'])).toHaveLength(0);
  });

  it('when someone signs up, then the account has no role and no customer, and only /api/me answers', async () => {
    const agent = t.agent();
    const res = await agent.post('/api/auth/sign-up/email').send({ name: 'Self Registered', email: 'self@example.org', password: 'long-enough-password' });
    expect(res.status).toBe(200);
    const [row] = await t.database.query<{ role: string | null; customer_id: string | null }>('select role, customer_id from "user" where email = $1', ['self@example.org']);
    expect(row).toEqual({ role: null, customer_id: null });

    // Signed in (auto sign-in after sign-up), but with no role: /api/me answers, everything else 403.
    const me = meSchema.parse((await agent.get('/api/me').expect(200)).body);
    expect(me.user.role).toBeNull();
    const denied = await agent.get('/api/customers').expect(403);
    expect(denied.body.error.message).toMatch(/no role/);
  });

  it('when an update body tries to set the role, then the role stays unset', async () => {
    const agent = await t.signInAs('self@example.org', 'long-enough-password');
    await agent.post('/api/auth/update-user').send({ role: 'admin' });
    const [row] = await t.database.query<{ role: string | null }>('select role from "user" where email = $1', ['self@example.org']);
    expect(row.role).toBeNull();
  });
});
