/*
 * The audit trail (ISO/IEC 17025:2017 §7.5 technical records, §8.4 control of records: records
 * kept so that changes can be traced, original content not obscured). Expected behaviour is
 * this project's design (append-only table, SHA-256 hash chain; FIPS 180-4 for SHA-256).
 */
import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recordAudit, verifyAuditChain, canonicalJson } from '../../server/audit';
import { createTestApp, type TestApp } from '../setup/test-app';

describe('audit trail: append-only table with a SHA-256 hash chain', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ seed: false });
  });
  afterAll(() => t?.close());

  it('when rows are recorded, then each links to the previous one and the chain verifies', async () => {
    const db = t.database.db;
    const a = await recordAudit(db, { actor: null, action: 'create', entity: 'test', entityId: 'a', after: { n: 1, when: new Date('2026-01-02T03:04:05Z') } });
    const b = await db.transaction((tx) =>
      recordAudit(tx, { actor: { id: 'u1', name: 'Tess Tester', role: 'admin' }, action: 'update', entity: 'test', entityId: 'a', before: { n: 1 }, after: { n: 2, z: [1, null], a: 'x' } }),
    );
    expect(b.seq).toBeGreaterThan(a.seq);
    const rows = await t.database.query<{ seq: string; prev_hash: string; hash: string; after: unknown }>('select seq, prev_hash, hash, after from audit_log order by seq');
    expect(rows[0].prev_hash).toBe('0'.repeat(64));
    expect(rows[1].prev_hash).toBe(rows[0].hash);
    expect(rows[0].after).toEqual({ n: 1, when: '2026-01-02T03:04:05.000Z' });
    expect(await verifyAuditChain(db)).toMatchObject({ ok: true, checked: 2, lastSeq: b.seq, lastHash: b.hash });
  });

  it('when the surrounding transaction rolls back, then no audit row stays (written in the same transaction)', async () => {
    const before = await t.database.query('select seq from audit_log');
    await expect(
      t.database.db.transaction(async (tx) => {
        await recordAudit(tx, { actor: null, action: 'create', entity: 'test', entityId: 'rolled-back' });
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    expect(await t.database.query('select seq from audit_log')).toHaveLength(before.length);
    expect((await verifyAuditChain(t.database.db)).ok).toBe(true);
  });

  it('when many writers append at once, then the chain does not fork', async () => {
    await Promise.all(
      Array.from({ length: 12 }, (_, i) =>
        t.database.db.transaction((tx) => recordAudit(tx, { actor: null, action: 'create', entity: 'test', entityId: `c${i}` })),
      ),
    );
    const forks = await t.database.query<{ n: number }>('select count(*)::int as n from audit_log group by prev_hash having count(*) > 1');
    expect(forks).toHaveLength(0);
    expect((await verifyAuditChain(t.database.db)).ok).toBe(true);
  });

  it('when an audit row is updated or deleted through SQL, then the trigger refuses it', async () => {
    await expect(t.database.query(`update audit_log set action = 'tampered' where entity_id = 'a'`)).rejects.toThrow(/append-only/);
    await expect(t.database.query(`delete from audit_log where entity_id = 'a'`)).rejects.toThrow(/append-only/);
    await expect(t.database.query(`truncate audit_log`)).rejects.toThrow(/append-only/);
    const rows = await t.database.query<{ action: string }>(`select action from audit_log where entity_id = 'a' order by seq`);
    expect(rows.map((r) => r.action)).toEqual(['create', 'update']);
  });

  it('when a database owner disables the trigger and changes a row, then verify chain names that row', async () => {
    const [target] = await t.database.query<{ seq: string }>(`select seq from audit_log where entity_id = 'a' and action = 'update'`);
    await t.database.query('alter table audit_log disable trigger audit_log_append_only');
    try {
      await t.database.query(`update audit_log set after = '{"n": 3}'::jsonb where seq = $1`, [target.seq]);
    } finally {
      await t.database.query('alter table audit_log enable trigger audit_log_append_only');
    }
    const report = await verifyAuditChain(t.database.db);
    expect(report.ok).toBe(false);
    expect(report.firstBrokenSeq).toBe(Number(target.seq));
    expect(report.reason).toMatch(/altered/);
    // The trigger is back on.
    await expect(t.database.query(`update audit_log set action = 'x' where seq = $1`, [target.seq])).rejects.toThrow(/append-only/);
  });
});

describe('audit trail: a row rewritten together with its own hash', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ seed: false });
  });
  afterAll(() => t?.close());

  it('when a row and its hash are both rewritten, then the next row no longer links and is named', async () => {
    for (const id of ['r1', 'r2', 'r3']) await recordAudit(t.database.db, { actor: null, action: 'create', entity: 'test', entityId: id });
    const rows = await t.database.query<{ seq: string }>('select seq from audit_log order by seq');
    await t.database.query('alter table audit_log disable trigger audit_log_append_only');
    await t.database.query(`update audit_log set hash = $1 where seq = $2`, [crypto.createHash('sha256').update('forged').digest('hex'), rows[1].seq]);
    await t.database.query('alter table audit_log enable trigger audit_log_append_only');
    const report = await verifyAuditChain(t.database.db);
    expect(report.ok).toBe(false);
    // Row 2's own content no longer matches its (forged) hash.
    expect(report.firstBrokenSeq).toBe(Number(rows[1].seq));
  });

  it('canonical JSON sorts keys, drops undefined and is what the hash covers', () => {
    expect(canonicalJson({ b: 1, a: [true, undefined, 'x'], c: undefined, d: { z: null, y: 2 } })).toBe('{"a":[true,null,"x"],"b":1,"d":{"y":2,"z":null}}');
  });
});

describe('audited changes: lab settings and user creation', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t?.close());

  it('when the admin saves the lab settings, then an audit row holds who, before and after', async () => {
    const admin = await t.signIn('admin');
    const body = { name: 'Renamed Lab (demo)', address: '1 Test Lane', accreditationNumber: 'X-1', contactEmail: '', contactPhone: '' };
    await admin.put('/api/lab').send(body).expect(200);
    const [row] = await t.database.query<{ actor_name: string; actor_role: string; before: { name: string }; after: { name: string } }>(
      `select * from audit_log where entity = 'lab_settings' order by seq desc limit 1`,
    );
    expect(row.actor_role).toBe('admin');
    expect(row.actor_name).toBe('Alex Admin (demo)');
    expect(row.before.name).toContain('Kestrel Vale');
    expect(row.after.name).toBe('Renamed Lab (demo)');
  });

  it('when the admin creates a user, then an audit row records it and the password is not in it', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.post('/api/users').send({ name: 'Audit Person', email: 'audit.person@example.org', role: 'analyst', password: 'a-good-long-password' }).expect(201);
    const rows = await t.database.query<{ action: string; after: Record<string, unknown> }>(`select * from audit_log where entity = 'user' and entity_id = $1`, [res.body.user.id]);
    expect(rows).toHaveLength(1);
    expect(rows[0].action).toBe('create');
    expect(rows[0].after.email).toBe('audit.person@example.org');
    expect(JSON.stringify(rows[0].after)).not.toContain('a-good-long-password');
    expect((await verifyAuditChain(t.database.db)).ok).toBe(true);
  });
});
