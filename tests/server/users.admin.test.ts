/*
 * User administration (issue 7): invitations with a one-time link, role changes, deactivation,
 * password reset, and the rule that the last active admin stays. ISO/IEC 17025:2017 §6.2.5 f)
 * (authorisation of personnel) and §8.4 (records; every change audited).
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { userSummarySchema } from '../../shared/schemas/users.schema';
import { createTestApp, type TestApp } from '../setup/test-app';

type Agent = Awaited<ReturnType<TestApp['signIn']>>;

describe('/api/users administration and /api/invitations', () => {
  let t: TestApp;
  let admin: Agent;
  let adminId: string;

  const linkFor = async (email: string, subject: RegExp) => {
    await t.deps.outbox.runOnce();
    const mail = await t.smtp.waitFor((m) => m.envelope.to.includes(email) && subject.test(m.subject));
    const m = /\/set-password\?token=([A-Za-z0-9_-]+)/.exec(mail.text);
    expect(m, 'the mail carries a set-password link').not.toBeNull();
    return { token: m![1], mail };
  };

  beforeAll(async () => {
    t = await createTestApp();
    admin = await t.signIn('admin');
    adminId = (await admin.get('/api/me').expect(200)).body.user.id;
  });
  afterAll(() => t?.close());

  it('when the admin creates a user without a password, then an invitation e-mail brings a one-time link to set one', async () => {
    const res = await admin.post('/api/users').send({ name: 'Ivy Invited', email: 'ivy@example.org', role: 'analyst' }).expect(201);
    const u = userSummarySchema.parse(res.body.user);
    expect(u).toMatchObject({ active: true, invitationPending: true, role: 'analyst' });
    const { token, mail } = await linkFor('ivy@example.org', /account/);
    expect(mail.text).toContain('http://localhost:3000/set-password?token=');
    expect(mail.text).toContain('Kestrel Vale');

    const info = await t.agent().get(`/api/invitations/${token}`).expect(200);
    expect(info.body.invitation).toMatchObject({ name: 'Ivy Invited', email: 'ivy@example.org' });

    const short = await t.agent().post('/api/invitations/accept').send({ token, password: 'short' }).expect(400);
    expect(short.body.error.issues[0].message).toMatch(/at least 10 characters/);
    await t.agent().post('/api/invitations/accept').send({ token, password: 'ivy-chosen-password' }).expect(200);
    const ivy = await t.signInAs('ivy@example.org', 'ivy-chosen-password');
    expect((await ivy.get('/api/me').expect(200)).body.user.role).toBe('analyst');

    // Single use.
    const again = await t.agent().post('/api/invitations/accept').send({ token, password: 'another-password-1' }).expect(404);
    expect(again.body.error.message).toMatch(/used already or has expired/);
    await t.agent().get(`/api/invitations/${token}`).expect(404);
    const audit = await t.database.query<{ action: string }>(`select action from audit_log where entity = 'user' and entity_id = $1 order by seq`, [u.id]);
    expect(audit.map((a) => a.action)).toEqual(['create', 'invite', 'set_password']);
  });

  it('when the link has expired, then it is refused', async () => {
    let now = new Date();
    const t2 = await createTestApp({ clock: () => now });
    try {
      const a = await t2.signIn('admin');
      await a.post('/api/users').send({ name: 'Late Comer', email: 'late@example.org', role: 'signatory' }).expect(201);
      await t2.deps.outbox.runOnce();
      const mail = await t2.smtp.waitFor((m) => m.envelope.to.includes('late@example.org'));
      const token = /token=([A-Za-z0-9_-]+)/.exec(mail.text)![1];
      now = new Date(now.getTime() + 73 * 3_600_000);
      await t2.agent().post('/api/invitations/accept').send({ token, password: 'too-late-password' }).expect(404);
    } finally {
      await t2.close();
    }
  });

  it('when the admin changes a role, then it takes effect and the old sessions end', async () => {
    const res = await admin.post('/api/users').send({ name: 'Rolf Role', email: 'rolf@example.org', role: 'analyst', password: 'rolf-password-1' }).expect(201);
    const rolf = await t.signInAs('rolf@example.org', 'rolf-password-1');
    await rolf.get('/api/me').expect(200);
    const upd = await admin.patch(`/api/users/${res.body.user.id}`).send({ name: 'Rolf Role', role: 'signatory' }).expect(200);
    expect(upd.body.user.role).toBe('signatory');
    await rolf.get('/api/me').expect(401);
    const again = await t.signInAs('rolf@example.org', 'rolf-password-1');
    expect((await again.get('/api/me').expect(200)).body.user.role).toBe('signatory');
    const bad = await admin.patch(`/api/users/${res.body.user.id}`).send({ name: 'Rolf Role', role: 'customer' }).expect(400);
    expect(bad.body.error.issues[0].message).toMatch(/must belong to a customer organisation/);
  });

  it('when the admin deactivates a user, then sign-in is refused and sessions end; reactivation lets them back', async () => {
    const res = await admin.post('/api/users').send({ name: 'Dee Active', email: 'dee@example.org', role: 'quality_manager', password: 'dee-password-12' }).expect(201);
    const dee = await t.signInAs('dee@example.org', 'dee-password-12');
    const off = await admin.post(`/api/users/${res.body.user.id}/deactivate`).expect(200);
    expect(off.body.user.active).toBe(false);
    await dee.get('/api/me').expect(401);
    const refused = await t.agent().post('/api/auth/sign-in/email').send({ email: 'dee@example.org', password: 'dee-password-12' });
    expect(refused.status).toBe(403);
    expect(refused.headers['set-cookie'] ?? []).toHaveLength(0);
    await admin.post(`/api/users/${res.body.user.id}/deactivate`).expect(409);
    await admin.post(`/api/users/${res.body.user.id}/reset-password`).expect(409);
    await admin.post(`/api/users/${res.body.user.id}/reactivate`).expect(200);
    await t.signInAs('dee@example.org', 'dee-password-12');
  });

  it('when the admin resets a password, then the old password stops working and a new link arrives', async () => {
    const res = await admin.post('/api/users').send({ name: 'Rita Reset', email: 'rita@example.org', role: 'analyst', password: 'rita-old-password' }).expect(201);
    const rita = await t.signInAs('rita@example.org', 'rita-old-password');
    await admin.post(`/api/users/${res.body.user.id}/reset-password`).expect(200);
    await rita.get('/api/me').expect(401);
    expect((await t.agent().post('/api/auth/sign-in/email').send({ email: 'rita@example.org', password: 'rita-old-password' })).status).toBe(401);
    const { token } = await linkFor('rita@example.org', /new Emberline password/);
    await t.agent().post('/api/invitations/accept').send({ token, password: 'rita-new-password' }).expect(200);
    await t.signInAs('rita@example.org', 'rita-new-password');
  });

  it('when the last active admin would be demoted or deactivated, then 409 with a message; with a second admin it is allowed', async () => {
    const demote = await admin.patch(`/api/users/${adminId}`).send({ name: 'Alex Admin (demo)', role: 'analyst' }).expect(409);
    expect(demote.body.error).toMatchObject({ code: 'LAST_ADMIN' });
    expect(demote.body.error.message).toMatch(/last active administrator/);
    const deactivate = await admin.post(`/api/users/${adminId}/deactivate`).expect(409);
    expect(deactivate.body.error.code).toBe('LAST_ADMIN');
    expect((await admin.get(`/api/users/${adminId}`).expect(200)).body.user).toMatchObject({ role: 'admin', active: true });

    const second = await admin.post('/api/users').send({ name: 'Second Admin', email: 'second.admin@example.org', role: 'admin', password: 'second-admin-pw' }).expect(201);
    const other = await t.signInAs('second.admin@example.org', 'second-admin-pw');
    await other.post(`/api/users/${second.body.user.id}/deactivate`).expect(200);
    // Now the demo admin is the last active one again.
    await admin.post(`/api/users/${adminId}/deactivate`).expect(409);
  });

  it('when the body or id is bad, then 400; unknown id 404; duplicate e-mail 409; wrong role 403; no session 401', async () => {
    const bad = await admin.post('/api/users').send({ name: '', email: 'nope', role: 'wizard' }).expect(400);
    expect(bad.body.error.issues.map((i: { path: string[] }) => i.path.join('.'))).toEqual(expect.arrayContaining(['body.name', 'body.email', 'body.role']));
    await admin.post('/api/users').send({ name: 'Dup', email: 'ivy@example.org', role: 'analyst' }).expect(409);
    const unknown = '00000000-0000-4000-8000-000000000000';
    await admin.get(`/api/users/${unknown}`).expect(404);
    await admin.patch(`/api/users/${unknown}`).send({ name: 'X', role: 'analyst' }).expect(404);
    await admin.post(`/api/users/${unknown}/deactivate`).expect(404);
    await admin.post(`/api/users/${unknown}/reactivate`).expect(404);
    await admin.post(`/api/users/${unknown}/reset-password`).expect(404);
    await admin.get('/api/users/not-a-uuid').expect(400);
    const qm = await t.signIn('quality_manager');
    await qm.post(`/api/users/${adminId}/deactivate`).expect(403);
    await qm.patch(`/api/users/${adminId}`).send({ name: 'X', role: 'analyst' }).expect(403);
    await request(t.app).post(`/api/users/${adminId}/reset-password`).expect(401);
    await t.agent().post('/api/invitations/accept').send({ token: 'x'.repeat(40), password: 'whatever-long' }).expect(404);
    await t.agent().post('/api/invitations/accept').send({}).expect(400);
  });
});
