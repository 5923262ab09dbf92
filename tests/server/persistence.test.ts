import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runSeed, SEED_STEPS } from '../../server/db/seed';
import { DEMO_CUSTOMERS, DEMO_USERS } from '../../server/db/seed/demo-data';
import { createTestApp } from '../setup/test-app';

const counts = async (q: (sql: string) => Promise<Array<{ n: number }>>) => ({
  users: (await q('select count(*)::int as n from "user"'))[0].n,
  accounts: (await q('select count(*)::int as n from account'))[0].n,
  customers: (await q('select count(*)::int as n from customers'))[0].n,
  contacts: (await q('select count(*)::int as n from customer_contacts'))[0].n,
  lab: (await q('select count(*)::int as n from lab_settings'))[0].n,
});

describe('the same DATA_DIR across restarts', () => {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-restart-'));
  afterAll(() => fs.rmSync(dataDir, { recursive: true, force: true }));

  it('when the app is stopped and started again, then saved data, users and sessions are still there and the seed does not repeat', async () => {
    const first = await createTestApp({ dataDir, keepDatabase: true });
    const admin = await first.signIn('admin');
    await admin.put('/api/lab').send({ name: 'Kept Lab (demo)', address: 'Somewhere 1', accreditationNumber: 'DEMO-1', contactEmail: '', contactPhone: '' }).expect(200);
    await admin.post('/api/users').send({ name: 'Kept User', email: 'kept@example.org', role: 'signatory', password: 'a-good-long-password' }).expect(201);
    const cookie = await admin.get('/api/me').then((r) => r.request.cookies);
    const before = await counts((s) => first.database.query(s));
    await first.close();

    const second = await createTestApp({ dataDir });
    try {
      // Seeding ran again at start-up (createTestApp seeds) and changed nothing.
      expect(await counts((s) => second.database.query(s))).toEqual(before);
      expect(before).toEqual({ users: DEMO_USERS.length + 1, accounts: DEMO_USERS.length + 1, customers: DEMO_CUSTOMERS.length, contacts: 5, lab: 1 });
      const lab = await second.agent().get('/api/lab').expect(200);
      expect(lab.body.lab.name).toBe('Kept Lab (demo)');
      await second.signInAs('kept@example.org', 'a-good-long-password');
      // The auth secret was kept in DATA_DIR, so the old session cookie is still valid.
      const me = await second.agent().get('/api/me').set('Cookie', cookie).expect(200);
      expect(me.body.user.role).toBe('admin');
    } finally {
      await second.close();
    }
  });
});

describe('demo seed', () => {
  it('when it runs twice, then the second run does nothing and the counts stay the same', async () => {
    const t = await createTestApp();
    try {
      const once = await counts((s) => t.database.query(s));
      expect(await runSeed(t.deps)).toEqual([]);
      expect(await counts((s) => t.database.query(s))).toEqual(once);
      const steps = await t.database.query<{ step: string }>('select step from seed_runs order by step');
      expect(steps.map((s) => s.step).sort()).toEqual(SEED_STEPS.map((s) => s.name).sort());
    } finally {
      await t.close();
    }
  });

  it('when a step fails, then nothing of it is kept and it runs again next time', async () => {
    const t = await createTestApp({ seed: false });
    try {
      const failing = { name: 'test-failing', run: async ({ db }: Parameters<(typeof SEED_STEPS)[number]['run']>[0]) => {
        await SEED_STEPS[1].run({ db } as never);
        throw new Error('step failed half way');
      } };
      await expect(runSeed(t.deps, [failing])).rejects.toThrow('half way');
      expect((await counts((s) => t.database.query(s))).customers).toBe(0);
      expect(await t.database.query('select * from seed_runs')).toHaveLength(0);
      expect(await runSeed(t.deps)).toEqual(SEED_STEPS.map((s) => s.name));
    } finally {
      await t.close();
    }
  });
});
