import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema';
import { userListSchema, userSummarySchema } from '../../shared/schemas/users.schema';
import { createTestApp, type TestApp } from '../setup/test-app';

describe('/api/users (admin)', () => {
  let t: TestApp;
  let admin: Awaited<ReturnType<TestApp['signIn']>>;
  let customerId: string;
  beforeAll(async () => {
    t = await createTestApp();
    admin = await t.signIn('admin');
    const res = await admin.get('/api/customers').expect(200);
    customerId = res.body.customers[0].id;
  });
  afterAll(() => t?.close());

  it('when the admin lists users, then the five demo users are there with their roles', async () => {
    const { users } = userListSchema.parse((await admin.get('/api/users').expect(200)).body);
    expect(users.map((u) => u.role).sort()).toEqual(['admin', 'analyst', 'customer', 'quality_manager', 'signatory']);
    expect(users.find((u) => u.role === 'customer')?.customerName).toContain('(demo)');
  });

  it('when the admin creates an analyst with a password, then that person can sign in as analyst', async () => {
    const res = await admin
      .post('/api/users')
      .send({ name: 'New Analyst', email: 'New.Analyst@Example.org', role: 'analyst', password: 'a-good-long-password' })
      .expect(201);
    const created = userSummarySchema.parse(res.body.user);
    expect(created).toMatchObject({ email: 'new.analyst@example.org', role: 'analyst', customerId: null });
    const agent = await t.signInAs('new.analyst@example.org', 'a-good-long-password');
    const me = await agent.get('/api/me').expect(200);
    expect(me.body.user.role).toBe('analyst');
  });

  it('when the admin creates a customer user, then it belongs to the organisation', async () => {
    const res = await admin
      .post('/api/users')
      .send({ name: 'Customer Two', email: 'customer2@example.org', role: 'customer', customerId, password: 'a-good-long-password' })
      .expect(201);
    expect(res.body.user.customerId).toBe(customerId);
  });

  it('when the body is not valid, then 400 lists each problem by path', async () => {
    const res = await admin.post('/api/users').send({ name: '', email: 'not-an-email', role: 'wizard' }).expect(400);
    const body = apiErrorSchema.parse(res.body);
    expect(body.error.code).toBe('VALIDATION_FAILED');
    const paths = body.error.issues!.map((i) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['body.name', 'body.email', 'body.role']));
  });

  it('when a customer user names no organisation, or staff names one, then 400 on customerId', async () => {
    const a = await admin.post('/api/users').send({ name: 'C', email: 'c3@example.org', role: 'customer' }).expect(400);
    expect(a.body.error.issues[0].path).toEqual(['body', 'customerId']);
    const b = await admin.post('/api/users').send({ name: 'S', email: 's3@example.org', role: 'signatory', customerId }).expect(400);
    expect(b.body.error.issues[0].path).toEqual(['body', 'customerId']);
  });

  it('when the organisation does not exist, then 400 and no user is created', async () => {
    const res = await admin
      .post('/api/users')
      .send({ name: 'C', email: 'c4@example.org', role: 'customer', customerId: '00000000-0000-4000-8000-000000000000' })
      .expect(400);
    expect(res.body.error.issues[0].path).toEqual(['body', 'customerId']);
    expect(await t.database.query('select 1 from "user" where email = $1', ['c4@example.org'])).toHaveLength(0);
  });

  it('when the e-mail is taken, then 409 and the existing user is unchanged', async () => {
    const res = await admin.post('/api/users').send({ name: 'Other', email: 'ADMIN@emberline-demo.test', role: 'analyst' }).expect(409);
    expect(res.body.error.code).toBe('EMAIL_TAKEN');
    const [row] = await t.database.query<{ role: string }>('select role from "user" where email = $1', ['admin@emberline-demo.test']);
    expect(row.role).toBe('admin');
  });

  it('when the password is too short, then 400 on password', async () => {
    const res = await admin.post('/api/users').send({ name: 'P', email: 'p@example.org', role: 'analyst', password: 'short' }).expect(400);
    expect(res.body.error.issues[0].path).toEqual(['body', 'password']);
  });

  it('when someone other than the admin calls, then 401 without a session and 403 with another role', async () => {
    await request(t.app).post('/api/users').send({}).expect(401);
    for (const role of ['quality_manager', 'analyst', 'signatory', 'customer'] as const) {
      const agent = await t.signIn(role);
      const res = await agent.post('/api/users').send({ name: 'X', email: 'x@example.org', role: 'admin' }).expect(403);
      expect(res.body.error.code).toBe('FORBIDDEN');
    }
    expect(await t.database.query('select 1 from "user" where email = $1', ['x@example.org'])).toHaveLength(0);
  });
});
