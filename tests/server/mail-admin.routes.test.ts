/**
 * Certificate e-mail: issuing queues one message per customer contact who receives certificates,
 * with the signed PDF attached; the outbox delivers with retries (the SMTP server may be down when
 * the certificate is issued) exactly once; the e-mail log and the local mailbox (common practice,
 * no source).
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sha256Hex } from '../../server/signing';
import { createTestApp, type TestApp } from '../setup/test-app';
import { approve, submittedJob } from './certificates-helpers';

let now = new Date('2026-11-20T09:00:00Z');
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ clock: () => now });
}, 120_000);
afterAll(() => t?.close());

const rowsOf = (certificateId: string) =>
  t.database.query<{ id: string; to: string[]; status: string; attempts: number; last_error: string | null }>(
    'select o.id, o."to", o.status, o.attempts, o.last_error from mail_outbox o join certificate_mails m on m.outbox_id = o.id where m.certificate_id = $1 order by o.created_at',
    [certificateId],
  );

describe('certificate e-mail', () => {
  it('when the SMTP server is stopped, then issuing still succeeds; the mail is retried and delivered once it is back, exactly once', async () => {
    await t.smtp.stop();
    const { jobId } = await submittedJob(t);
    const cert = await approve(t, jobId);
    const queued = await rowsOf(cert.id);
    // Brightwater Glassworks has two contacts who receive certificates (demo data).
    expect(queued.map((r) => r.to[0]).sort()).toEqual(['m.holloway@brightwater-glass.example.com', 'quality@brightwater-glass.example.com']);

    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 0, retrying: 2, failed: 0 });
    const failed = await rowsOf(cert.id);
    expect(failed.every((r) => r.status === 'queued' && r.attempts === 1 && r.last_error)).toBe(true);

    // Not due yet: nothing happens before the back-off has passed.
    await t.smtp.restart();
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 0, retrying: 0, failed: 0 });
    now = new Date(now.getTime() + 31_000);
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 2, retrying: 0, failed: 0 });
    now = new Date(now.getTime() + 3_600_000);
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 0, retrying: 0, failed: 0 });

    const got = t.smtp.messages.filter((m) => m.subject.includes(cert.number));
    expect(got).toHaveLength(2);
    for (const m of got) {
      expect(m.attachments).toHaveLength(1);
      expect(m.attachments[0].filename).toBe(`${cert.number}.pdf`);
      expect(sha256Hex(m.attachments[0].content)).toBe(cert.pdfSha256);
    }
    const sentAudit = await t.database.query<{ n: number }>(
      "select count(*)::int as n from audit_log where entity = 'mail' and action = 'send_email' and entity_id = any($1::text[])",
      [queued.map((r) => r.id)],
    );
    expect(sentAudit[0].n).toBe(2);
  }, 120_000);

  it('the e-mail log shows status, attempts and last error to quality managers and admins, and resend delivers again', async () => {
    const qm = await t.signIn('quality_manager');
    const log = await qm.get('/api/mail/outbox').expect(200);
    const row = log.body.messages.find((m: { certificateNumber: string | null }) => m.certificateNumber);
    expect(row).toMatchObject({ status: 'sent', attempts: 2 });
    expect(row.attachments[0].filename).toMatch(/\.pdf$/);
    await (await t.signIn('analyst')).get('/api/mail/outbox').expect(403);
    await request(t.app).get('/api/mail/outbox').expect(401);

    const before = t.smtp.messages.length;
    const again = await qm.post(`/api/mail/outbox/${row.id}/resend`).expect(200);
    expect(again.body.copied).toBe(true);
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 1, retrying: 0, failed: 0 });
    expect(t.smtp.messages.length).toBe(before + 1);
    await qm.post('/api/mail/outbox/00000000-0000-4000-8000-000000000000/resend').expect(404);
  });

  it('the local mailbox page lists captured messages with their attachment for admins only', async () => {
    const admin = await t.signIn('admin');
    const box = await admin.get('/api/mail/mailbox').expect(200);
    expect(box.body.available).toBe(true);
    const m = box.body.messages.find((x: { attachments: unknown[] }) => x.attachments.length > 0);
    expect(m.attachments[0].contentType).toBe('application/pdf');
    const file = await admin.get(`/api/mail/mailbox/${m.id}/attachments/0`).expect(200);
    expect(file.headers['content-type']).toBe('application/pdf');
    await (await t.signIn('quality_manager')).get('/api/mail/mailbox').expect(403);
    await admin.get(`/api/mail/mailbox/${m.id}/attachments/7`).expect(404);
  });
});
