/*
 * The per-instance session cache (server/auth/session-cache.ts): a session looked up shortly
 * before is served from memory, yet every change made through the app that ends or changes a
 * session — sign-out, deactivation, role change, password reset — takes effect at the next
 * request, as without the cache; a change made behind the app's back (another instance, SQL) is
 * seen within SESSION_CACHE_SECONDS. Common practice for session caching, no source.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSessionCache } from '../../../server/auth/session-cache';
import type { SessionUser } from '../../../shared/schemas/me.schema';
import { createTestApp, type TestApp } from '../../setup/test-app';

const someone: SessionUser = { id: 'u1', name: 'A', email: 'a@example.org', role: 'analyst', customerId: null };

describe('createSessionCache', () => {
  it('when an entry is older than the time to live or its session has expired, then it is not served', () => {
    const c = createSessionCache(5000);
    c.set('k', someone, 1_000_000, 0, c.generation());
    expect(c.get('k', 4999)).toEqual(someone);
    expect(c.get('k', 5000)).toBeUndefined();
    c.set('s', someone, 2000, 0, c.generation()); // the session itself ends at t = 2000
    expect(c.get('s', 1999)).toEqual(someone);
    expect(c.get('s', 2000)).toBeUndefined();
  });

  it('when clear() ran while a look-up was under way, then its result is not stored', () => {
    const c = createSessionCache(5000);
    const g = c.generation();
    c.clear();
    c.set('k', someone, 1_000_000, 0, g);
    expect(c.get('k', 1)).toBeUndefined();
    c.set('k', someone, 1_000_000, 0, c.generation());
    expect(c.get('k', 1)).toEqual(someone);
  });

  it('when the time to live is 0, then nothing is stored', () => {
    const c = createSessionCache(0);
    c.set('k', someone, 1_000_000, 0, c.generation());
    expect(c.get('k', 0)).toBeUndefined();
  });

  it('when more than 2000 sessions are remembered, then the least recently used is forgotten first', () => {
    const c = createSessionCache(60_000);
    for (let i = 0; i < 2000; i++) c.set(`k${i}`, someone, 1e9, 0, c.generation());
    expect(c.get('k0', 1)).toEqual(someone); // k0 is now the most recently used
    c.set('new', someone, 1e9, 1, c.generation());
    expect(c.get('k0', 2)).toEqual(someone);
    expect(c.get('k1', 2)).toBeUndefined();
    expect(c.get('new', 2)).toEqual(someone);
  });
});

describe('session cache in the app (SESSION_CACHE_SECONDS=5)', () => {
  let t: TestApp;
  let now = Date.parse('2026-12-01T09:00:00Z');
  const later = (ms: number) => { now += ms; };

  beforeAll(async () => {
    t = await createTestApp({ env: { SESSION_CACHE_SECONDS: '5' }, clock: () => new Date(now) });
  });
  afterAll(() => t?.close());

  const newUser = async (name: string, email: string, role: string) => {
    const admin = await t.signIn('admin');
    const res = await admin.post('/api/users').send({ name, email, role, password: `${email}-password` }).expect(201);
    return { admin, id: res.body.user.id as string, agent: await t.signInAs(email, `${email}-password`) };
  };

  it('when the session row disappears behind the app, then the cached session serves until the time to live runs out', async () => {
    const { agent, id } = await newUser('Cass Cache', 'cass@example.org', 'analyst');
    await agent.get('/api/me').expect(200); // looked up and remembered
    await t.database.query('DELETE FROM "session" WHERE user_id = $1', [id]);
    await agent.get('/api/me').expect(200); // from the cache
    later(5001);
    await agent.get('/api/me').expect(401);
  });

  it('when an admin deactivates a user, then the next request of that user is refused at once', async () => {
    const { admin, agent, id } = await newUser('Dana Off', 'dana@example.org', 'analyst');
    await agent.get('/api/me').expect(200);
    await admin.post(`/api/users/${id}/deactivate`).expect(200);
    await agent.get('/api/me').expect(401);
  });

  it('when an admin changes a role, then the next request carries no old role', async () => {
    const { admin, agent, id } = await newUser('Rory Role', 'rory@example.org', 'analyst');
    await agent.get('/api/jobs').expect(200);
    await admin.patch(`/api/users/${id}`).send({ name: 'Rory Role', role: 'quality_manager' }).expect(200);
    // The role change ended the session (users service): refused, not served with the old role.
    await agent.get('/api/jobs').expect(401);
    const again = await t.signInAs('rory@example.org', 'rory@example.org-password');
    expect((await again.get('/api/me').expect(200)).body.user.role).toBe('quality_manager');
  });

  it('when a user signs out or an admin resets the password, then the old cookie is refused at once', async () => {
    const { admin, agent, id } = await newUser('Sid Signout', 'sid@example.org', 'analyst');
    await agent.get('/api/me').expect(200);
    await agent.post('/api/auth/sign-out').set('Origin', t.origin).send({}).expect(200);
    await agent.get('/api/me').expect(401);
    const second = await t.signInAs('sid@example.org', 'sid@example.org-password');
    await second.get('/api/me').expect(200);
    await admin.post(`/api/users/${id}/reset-password`).expect(200);
    await second.get('/api/me').expect(401);
  });
});
