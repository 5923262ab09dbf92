import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { labPublicSchema, labSettingsSchema } from '../../shared/schemas/lab.schema';
import { DEMO_LAB } from '../../server/db/seed';
import { createApp } from '../../server/app';
import { createTestApp, type TestApp } from '../setup/test-app';

describe('/api/lab', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t?.close());

  it('when anyone asks, then the public subset without contact details', async () => {
    const res = await request(t.app).get('/api/lab').expect(200);
    expect(labPublicSchema.strict().parse(res.body.lab)).toEqual({
      name: DEMO_LAB.name,
      address: DEMO_LAB.address,
      accreditationNumber: DEMO_LAB.accreditationNumber,
    });
  });

  it('when the admin saves the settings, then they are returned and kept', async () => {
    const admin = await t.signIn('admin');
    const next = { ...DEMO_LAB, name: '  Renamed Lab (demo)  ', contactPhone: '+00 555 0199' };
    const res = await admin.put('/api/lab').send(next).expect(200);
    expect(labSettingsSchema.parse(res.body.lab)).toMatchObject({ name: 'Renamed Lab (demo)', contactPhone: '+00 555 0199' });
    expect((await admin.get('/api/lab/settings').expect(200)).body.lab.name).toBe('Renamed Lab (demo)');
  });

  it('when the settings are not valid, then 400 names each field and nothing saved is lost', async () => {
    const admin = await t.signIn('admin');
    const before = (await admin.get('/api/lab/settings').expect(200)).body.lab;
    const res = await admin.put('/api/lab').send({ name: '', address: 'x', contactEmail: 'nope' }).expect(400);
    const paths = res.body.error.issues.map((i: { path: string[] }) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['body.name', 'body.accreditationNumber', 'body.contactEmail', 'body.contactPhone']));
    expect((await admin.get('/api/lab/settings').expect(200)).body.lab).toEqual(before);
  });

  it('when the JSON body is malformed, then 400 MALFORMED_JSON in the envelope', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.put('/api/lab').set('Content-Type', 'application/json').send('{"name": ').expect(400);
    expect(res.body.error.code).toBe('MALFORMED_JSON');
  });

  it('when a non-admin tries, then 403; without a session, 401', async () => {
    const qm = await t.signIn('quality_manager');
    await qm.put('/api/lab').send(DEMO_LAB).expect(403);
    await qm.get('/api/lab/settings').expect(403);
    await request(t.app).put('/api/lab').send(DEMO_LAB).expect(401);
  });
});

describe('/api/health and unknown routes', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ seed: false });
  });
  afterAll(() => t?.close());

  it('when health is asked without a session, then ok with the database kind', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    expect(res.body).toMatchObject({ status: 'ok', database: t.database.kind });
  });

  it('when an /api route does not exist, then 404 in the envelope, never the client page', async () => {
    for (const [method, url] of [['get', '/api/nothing-here'], ['post', '/api/lab/nothing'], ['delete', '/api/lab/settings/x']] as const) {
      const res = await request(t.app)[method](url).expect(404);
      expect(res.headers['content-type']).toMatch(/json/);
      expect(res.body.error.code).toBe('NOT_FOUND');
    }
  });

  it('when the client is not built, then / answers a short placeholder', async () => {
    const res = await request(t.app).get('/some/client/route').expect(200);
    expect(res.text).toMatch(/client has not been built/);
  });
});

describe('serving the built client', () => {
  let t: TestApp;
  let clientDir: string;
  beforeAll(async () => {
    t = await createTestApp({ seed: false });
    clientDir = path.join(t.dataDir, 'client');
    fs.mkdirSync(path.join(clientDir, 'assets'), { recursive: true });
    fs.writeFileSync(path.join(clientDir, 'index.html'), '<!doctype html><div id="root"></div>');
    fs.writeFileSync(path.join(clientDir, 'assets', 'app.js'), 'console.log(1)');
  });
  afterAll(() => t?.close());

  it('when a client route is asked, then index.html; an asset is served; a missing file is 404; /api stays JSON', async () => {
    const app = createApp(t.deps, { clientDir });
    expect((await request(app).get('/jobs/42').expect(200)).text).toContain('id="root"');
    expect((await request(app).get('/assets/app.js').expect(200)).text).toContain('console.log');
    await request(app).get('/assets/missing.js').expect(404);
    const api = await request(app).get('/api/missing').expect(404);
    expect(api.body.error.code).toBe('NOT_FOUND');
  });
});
