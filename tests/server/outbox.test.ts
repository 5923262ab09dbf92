import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { retryDelayMs } from '../../server/mail/outbox';
import { readMailbox } from '../../server/mail/fake-smtp';
import { createTestApp, type TestApp } from '../setup/test-app';
import path from 'node:path';

describe('mail outbox and the local fake SMTP server', () => {
  let t: TestApp;
  let now = new Date('2026-03-02T09:00:00Z');
  const clock = () => now;
  beforeAll(async () => {
    t = await createTestApp({ seed: false, clock });
  });
  afterAll(() => t?.close());

  const row = async (id: string) =>
    (await t.database.query<{ status: string; attempts: number; last_error: string | null }>('select status, attempts, last_error from mail_outbox where id = $1', [id]))[0];

  it('when a message with an attachment is queued and the loop runs, then the fake SMTP captures it byte for byte', async () => {
    const pdf = Buffer.from('%PDF-1.7\n% test bytes \x00\x01\x02\xff\n', 'binary');
    const { id, messageId } = await t.deps.outbox.enqueue({
      to: ['m.holloway@brightwater-glass.example.com'],
      subject: 'Calibration certificate DEMO-0001',
      text: 'Your certificate is attached.',
      html: '<p>Your certificate is attached.</p>',
      attachments: [{ filename: 'DEMO-0001.pdf', contentType: 'application/pdf', content: pdf }],
    });
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 1, retrying: 0, failed: 0 });
    const mail = await t.smtp.waitFor((m) => m.messageId === messageId);
    expect(mail.subject).toBe('Calibration certificate DEMO-0001');
    expect(mail.envelope.to).toEqual(['m.holloway@brightwater-glass.example.com']);
    expect(mail.attachments[0].content.equals(pdf)).toBe(true);
    expect(await row(id)).toMatchObject({ status: 'sent', attempts: 1 });
    // Kept as .eml in DATA_DIR/mailbox as well.
    const onDisk = await readMailbox(path.join(t.dataDir, 'mailbox'));
    expect(onDisk.some((m) => m.messageId === messageId)).toBe(true);
    // Nothing left to send.
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 0, retrying: 0, failed: 0 });
  });

  it('when the SMTP server is down, then the outbox backs off, retries, and delivers exactly once when it is back', async () => {
    await t.smtp.stop();
    const { id, messageId } = await t.deps.outbox.enqueue({ to: ['quality@brightwater-glass.example.com'], subject: 'Retry me', text: 'x' });

    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 0, retrying: 1, failed: 0 });
    expect(await row(id)).toMatchObject({ status: 'queued', attempts: 1 });
    expect((await row(id)).last_error).toBeTruthy();

    // Not due again before the back-off has passed.
    now = new Date(now.getTime() + retryDelayMs(1) - 1000);
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 0, retrying: 0, failed: 0 });

    now = new Date(now.getTime() + 2000);
    expect(await t.deps.outbox.runOnce()).toEqual({ sent: 0, retrying: 1, failed: 0 });
    expect(await row(id)).toMatchObject({ status: 'queued', attempts: 2 });

    await t.smtp.restart();
    now = new Date(now.getTime() + retryDelayMs(2));
    // Two loops running at once (e.g. two processes) still send it once: the claim decides.
    const results = await Promise.all([t.deps.outbox.runOnce(), t.deps.outbox.runOnce()]);
    expect(results.reduce((n, r) => n + r.sent, 0)).toBe(1);
    await t.smtp.waitFor((m) => m.messageId === messageId);
    now = new Date(now.getTime() + 24 * 3600_000);
    await t.deps.outbox.runOnce();
    expect(t.smtp.messages.filter((m) => m.messageId === messageId)).toHaveLength(1);
    expect(await row(id)).toMatchObject({ status: 'sent', attempts: 3, last_error: null });
  });

  it('when a claim was abandoned (a sender crashed mid-send), then after the lease it is sent again with the same Message-ID', async () => {
    const { id, messageId } = await t.deps.outbox.enqueue({ to: ['j.whitcombe@stonebridge-thermal.example.com'], subject: 'Abandoned', text: 'x' });
    await t.database.query(`update mail_outbox set status = 'sending', claimed_at = $2, attempts = 1 where id = $1`, [id, now.toISOString()]);
    expect((await t.deps.outbox.runOnce()).sent).toBe(0);
    now = new Date(now.getTime() + 6 * 60_000);
    expect((await t.deps.outbox.runOnce()).sent).toBe(1);
    const got = await t.smtp.waitFor((m) => m.messageId === messageId);
    expect(got.subject).toBe('Abandoned');
  });

  it('retry delays double from 30 s and stop at one hour', () => {
    expect([1, 2, 3, 4].map((n) => retryDelayMs(n))).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(retryDelayMs(20)).toBe(3_600_000);
  });
});
