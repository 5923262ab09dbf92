/**
 * Mail across failures and restarts (issue 8): with SMTP down the outbox keeps every message and
 * keeps retrying; after a restart on the same DATA_DIR each message is delivered exactly once and
 * a message already sent is never sent again (sending is idempotent per outbox row: the claim in
 * one UPDATE decides, the Message-ID is fixed at enqueue time).
 * Sources: RFC 5322 §3.6.4 (Message-ID: one unique identifier per message, so a receiver can tell
 * a repeat); transactional-outbox pattern, common practice, no source.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readMailbox } from '../../../server/mail/fake-smtp';
import { createTestApp, type TestApp } from '../../setup/test-app';

describe('outbox across SMTP outages and restarts', () => {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-outbox-restart-'));
  let now = new Date('2026-12-01T09:00:00Z');
  const clock = () => now;
  const open = () => createTestApp({ dataDir, keepDatabase: true, seed: false, clock });
  let t: TestApp | null = null;
  afterAll(async () => {
    await t?.close();
    fs.rmSync(dataDir, { recursive: true, force: true });
  });

  const rows = async (app: TestApp) => app.database.query<{ id: string; message_id: string; status: string; attempts: number }>('select id, message_id, status, attempts from mail_outbox order by created_at');
  const delivered = async () => {
    const all = await readMailbox(path.join(dataDir, 'mailbox'));
    const count = new Map<string, number>();
    for (const m of all) count.set(m.messageId ?? '', (count.get(m.messageId ?? '') ?? 0) + 1);
    return count;
  };

  it('when SMTP is down for several attempts and the server restarts, then every message is delivered exactly once', async () => {
    t = await open();
    await t.smtp.stop();
    const queued = [];
    for (let i = 1; i <= 5; i++) queued.push(await t.deps.outbox.enqueue({ to: [`contact${i}@example.com`], subject: `Certificate ${i}`, text: `message ${i}` }));
    for (let attempt = 1; attempt <= 4; attempt++) {
      const r = await t.deps.outbox.runOnce();
      expect(r).toEqual({ sent: 0, retrying: 5, failed: 0 });
      now = new Date(now.getTime() + 2 * 3600_000);
    }
    // Nothing lost, nothing given up on.
    const byId = (a: unknown[], b: unknown[]) => String(a[0]).localeCompare(String(b[0]));
    expect((await rows(t)).map((r) => [r.message_id, r.status, r.attempts]).sort(byId)).toEqual(queued.map((q) => [q.messageId, 'queued', 4]).sort(byId));
    await t.close();

    // Restart with SMTP back: each message goes out once.
    t = await open();
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 5, retrying: 0, failed: 0 });
    for (const q of queued) await t.smtp.waitFor((m) => m.messageId === q.messageId);
    now = new Date(now.getTime() + 24 * 3600_000);
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 0, retrying: 0, failed: 0 });
    await t.close();

    // Restart again, a day later: nothing is sent a second time.
    t = await open();
    now = new Date(now.getTime() + 24 * 3600_000);
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 0, retrying: 0, failed: 0 });
    expect(t.smtp.messages).toHaveLength(0);
    expect((await rows(t)).every((r) => r.status === 'sent' && r.attempts === 5)).toBe(true);
    const counts = await delivered();
    for (const q of queued) expect(counts.get(q.messageId), q.messageId).toBe(1);
    await t.close();
    t = null;
  });

  it('when the server died while a message was claimed, then after restart and the claim lease it is sent once, with its original Message-ID', async () => {
    t = await open();
    const q = await t.deps.outbox.enqueue({ to: ['late@example.com'], subject: 'Claimed then crashed', text: 'x' });
    // What a crash between the claim and the SMTP conversation leaves behind.
    await t.database.query(`update mail_outbox set status = 'sending', claimed_at = $2, claim_token = gen_random_uuid(), attempts = attempts + 1 where id = $1`, [q.id, now.toISOString()]);
    await t.close();

    t = await open();
    expect((await t.deps.outbox.runOnce()).sent).toBe(0);
    now = new Date(now.getTime() + 6 * 60_000);
    expect((await t.deps.outbox.runOnce()).sent).toBe(1);
    const got = await t.smtp.waitFor((m) => m.messageId === q.messageId);
    expect(got.subject).toBe('Claimed then crashed');
    now = new Date(now.getTime() + 3600_000);
    expect((await t.deps.outbox.runOnce()).sent).toBe(0);
    expect((await delivered()).get(q.messageId)).toBe(1);
  });
});
