/*
 * The audit page's API (ISO/IEC 17025:2017 §8.4 control of records): filters, paging, CSV export
 * with formula injection neutralised (OWASP "CSV Injection": cells beginning with = + - @), and
 * the chain check.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditFacetsSchema, auditPageSchema, auditVerifySchema } from '../../shared/schemas/audit.schema';
import { csvField } from '../../server/modules/audit/csv';
import { createTestApp, type TestApp } from '../setup/test-app';

type Agent = Awaited<ReturnType<TestApp['signIn']>>;

describe('/api/audit', () => {
  let t: TestApp;
  let qm: Agent;
  let qmId: string;
  beforeAll(async () => {
    t = await createTestApp({ clock: () => new Date('2026-03-10T12:00:00Z') });
    qm = await t.signIn('quality_manager');
    qmId = (await qm.get('/api/me').expect(200)).body.user.id;
    // A customer whose name is a formula, to check the export.
    await qm.post('/api/customers').send({ organisation: '=HYPERLINK("http://evil.example.com")', address: '+1 Formula Street' }).expect(201);
    await qm.post('/api/customers').send({ organisation: '@SUM(1)', address: '' }).expect(201);
  });
  afterAll(() => t?.close());

  it('when a quality manager pages through the trail, then newest first with a total', async () => {
    const first = auditPageSchema.parse((await qm.get('/api/audit?pageSize=5').expect(200)).body);
    expect(first.entries).toHaveLength(5);
    expect(first.total).toBeGreaterThan(10);
    expect(first.entries[0].seq).toBeGreaterThan(first.entries[4].seq);
    const second = auditPageSchema.parse((await qm.get('/api/audit?pageSize=5&page=2').expect(200)).body);
    expect(second.entries[0].seq).toBeLessThan(first.entries[4].seq);
  });

  it('when filtering by entity, user and dates, then only matching rows come back', async () => {
    const byEntity = auditPageSchema.parse((await qm.get('/api/audit?entity=reference_standard').expect(200)).body);
    expect(byEntity.total).toBe(5);
    expect(byEntity.entries.every((e) => e.entity === 'reference_standard')).toBe(true);
    const byUser = auditPageSchema.parse((await qm.get(`/api/audit?actorId=${qmId}`).expect(200)).body);
    expect(byUser.total).toBeGreaterThanOrEqual(2);
    expect(byUser.entries.every((e) => e.actorId === qmId)).toBe(true);
    const inRange = auditPageSchema.parse((await qm.get('/api/audit?from=2026-03-10&to=2026-03-10').expect(200)).body);
    const total = auditPageSchema.parse((await qm.get('/api/audit').expect(200)).body).total;
    expect(inRange.total).toBe(total);
    const outside = auditPageSchema.parse((await qm.get('/api/audit?from=2026-03-11').expect(200)).body);
    expect(outside.total).toBe(0);
    const facets = auditFacetsSchema.parse((await qm.get('/api/audit/facets').expect(200)).body);
    expect(facets.entities).toEqual(expect.arrayContaining(['customer', 'reference_standard', 'user']));
    expect(facets.actors.map((a) => a.id)).toContain(qmId);
  });

  it('when the query is bad, then 400 names the field', async () => {
    const res = await qm.get('/api/audit?from=10/03/2026&page=0&pageSize=1000').expect(400);
    const paths = res.body.error.issues.map((i: { path: string[] }) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['query.from', 'query.page', 'query.pageSize']));
    const order = await qm.get('/api/audit?from=2026-03-10&to=2026-03-01').expect(400);
    expect(order.body.error.issues[0].message).toMatch(/end date is before the start date/);
  });

  it('when exporting CSV, then every filtered row is there and formula-like cells start with an apostrophe', async () => {
    const res = await qm.get('/api/audit/export.csv?entity=customer').expect(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="?audit-trail-2026-03-10\.csv"?/);
    const lines = res.text.replace(/^\uFEFF/, '').trim().split('\r\n');
    expect(lines[0]).toBe('seq,at,actor_id,actor_name,actor_role,action,entity,entity_id,before,after,hash');
    expect(lines).toHaveLength(3);
    // The names sit inside the JSON "after" cell, which starts with "{": no formula there.
    expect(lines[1]).toContain('HYPERLINK');
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField('+1 Formula Street')).toBe("'+1 Formula Street");
    expect(csvField('-2')).toBe("'-2");
    expect(csvField('@SUM(1)')).toBe("'@SUM(1)");
    expect(csvField('plain, with comma')).toBe('"plain, with comma"');
    expect(csvField(null)).toBe('');
  });

  it('when an actor name itself begins with =, then the exported cell is neutralised', async () => {
    const admin = await t.signIn('admin');
    await admin.post('/api/users').send({ name: '=cmd|calc', email: 'formula.person@example.org', role: 'quality_manager', password: 'formula-password' }).expect(201);
    const f = await t.signInAs('formula.person@example.org', 'formula-password');
    await f.post('/api/customers').send({ organisation: 'Formula Person Org (demo)' }).expect(201);
    const res = await qm.get('/api/audit/export.csv?entity=customer').expect(200);
    const row = res.text.split('\r\n').find((l) => l.includes('Formula Person Org'))!;
    expect(row.split(',')[3]).toBe("'=cmd|calc");
  });

  it('when verifying the chain, then it reports ok and how many rows it checked', async () => {
    const res = auditVerifySchema.parse((await qm.post('/api/audit/verify').expect(200)).body);
    expect(res.ok).toBe(true);
    expect(res.checked).toBe(auditPageSchema.parse((await qm.get('/api/audit').expect(200)).body).total);
  });

  it('roles: admins read it; analysts, signatories and customers get 403; anonymous 401', async () => {
    const admin = await t.signIn('admin');
    await admin.get('/api/audit').expect(200);
    for (const role of ['analyst', 'signatory', 'customer'] as const) {
      const a = await t.signIn(role);
      await a.get('/api/audit').expect(403);
      await a.get('/api/audit/export.csv').expect(403);
      await a.post('/api/audit/verify').expect(403);
    }
    await request(t.app).get('/api/audit').expect(401);
    await request(t.app).get('/api/audit/facets').expect(401);
  });
});
