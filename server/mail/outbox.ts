import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { and, asc, eq, inArray, lte, or, sql } from 'drizzle-orm';
import { recordAudit } from '../audit/record';
import type { Db } from '../db/client';
import { mailOutbox, type OutboxAttachment } from '../db/schema';
import type { Logger } from '../logger';
import type { Mailer } from './mailer';

export type EnqueueMail = {
  to: string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: Array<{ filename: string; contentType: string; content: Buffer }>;
};

export type OutboxRunResult = { sent: number; retrying: number; failed: number };

export type OutboxOptions = {
  db: Db;
  mailer: Mailer;
  clock: () => Date;
  logger: Logger;
  /** Attachment bytes are kept under `<dataDir>/outbox/<row id>/`. */
  dataDir: string;
  /** Domain part of generated Message-IDs. */
  messageIdDomain: string;
  /** Attempts before a row is marked failed (default 8). */
  maxAttempts?: number;
  /** First retry delay; doubles each attempt up to `maxDelayMs` (defaults 30 s, 1 h). */
  baseDelayMs?: number;
  maxDelayMs?: number;
  /** A 'sending' claim older than this is considered abandoned and taken over (default 5 min). */
  claimLeaseMs?: number;
  /** Rows per run (default 20). */
  batchSize?: number;
};

export type Outbox = {
  /** Queues a message; pass a transaction as `db` to queue it atomically with what caused it. */
  enqueue(mail: EnqueueMail, db?: Db): Promise<{ id: string; messageId: string }>;
  /** Sends what is due now, once. */
  runOnce(): Promise<OutboxRunResult>;
  /** Runs `runOnce` every `intervalMs` until `stop()`. */
  start(intervalMs?: number): void;
  /** Asks the loop to run soon (after an enqueue). */
  kick(): void;
  /** Stops the loop and waits for a run in progress. */
  stop(): Promise<void>;
  /**
   * Sends a message again: a failed or queued row is due now with a fresh attempt count; a sent
   * row is copied to a new row (same content and attachments, a new Message-ID, since it is a new
   * delivery). Returns the row that will be sent, or null when there is no such row.
   */
  resend(id: string, tx?: Db): Promise<{ id: string; messageId: string; copied: boolean } | null>;
};

/** Delay before attempt n+1 after n failed attempts: base·2^(n−1), capped. */
export function retryDelayMs(failedAttempts: number, baseMs = 30_000, maxMs = 3_600_000): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, failedAttempts - 1));
}

/**
 * The outbox: e-mail is written to `mail_outbox` and sent by this loop with retries and
 * exponential back-off. A row is claimed (status 'sending', a fresh claim token, attempts + 1)
 * in one UPDATE before the SMTP conversation, so two loops never send the same row at once; the
 * Message-ID is fixed at enqueue time, so the rare re-send after a crash between the SMTP
 * acceptance and the 'sent' update carries the same Message-ID.
 */
export function createOutbox(opts: OutboxOptions): Outbox {
  const maxAttempts = opts.maxAttempts ?? 8;
  const baseDelay = opts.baseDelayMs ?? 30_000;
  const maxDelay = opts.maxDelayMs ?? 3_600_000;
  const lease = opts.claimLeaseMs ?? 5 * 60_000;
  const batchSize = opts.batchSize ?? 20;
  const { db, mailer, clock, logger } = opts;

  let timer: NodeJS.Timeout | null = null;
  let current: Promise<unknown> | null = null;
  let stopped = true;
  let intervalMs = 5_000;

  async function enqueue(mail: EnqueueMail, tx: Db = db) {
    if (mail.to.length === 0) throw new Error('An e-mail needs at least one recipient.');
    const id = crypto.randomUUID();
    const messageId = `<${id}@${opts.messageIdDomain}>`;
    const attachments: OutboxAttachment[] = [];
    if (mail.attachments?.length) {
      const rel = path.join('outbox', id);
      fs.mkdirSync(path.join(opts.dataDir, rel), { recursive: true });
      mail.attachments.forEach((a, i) => {
        const file = path.join(rel, `${i + 1}-${a.filename.replace(/[^\w.-]+/g, '_')}`);
        fs.writeFileSync(path.join(opts.dataDir, file), a.content);
        attachments.push({
          filename: a.filename,
          contentType: a.contentType,
          size: a.content.length,
          sha256: crypto.createHash('sha256').update(a.content).digest('hex'),
          path: file,
        });
      });
    }
    await tx.insert(mailOutbox).values({
      id,
      messageId,
      to: mail.to,
      subject: mail.subject,
      text: mail.text,
      html: mail.html ?? null,
      attachments,
      status: 'queued',
      nextAttemptAt: clock(),
      createdAt: clock(),
    });
    return { id, messageId };
  }

  async function claim(now: Date) {
    const token = crypto.randomUUID();
    const due = db
      .select({ id: mailOutbox.id })
      .from(mailOutbox)
      .where(
        or(
          and(eq(mailOutbox.status, 'queued'), lte(mailOutbox.nextAttemptAt, now)),
          and(eq(mailOutbox.status, 'sending'), lte(mailOutbox.claimedAt, new Date(now.getTime() - lease))),
        ),
      )
      .orderBy(asc(mailOutbox.nextAttemptAt))
      .limit(batchSize)
      .for('update', { skipLocked: true });
    return db
      .update(mailOutbox)
      .set({ status: 'sending', claimedAt: now, claimToken: token, attempts: sql`${mailOutbox.attempts} + 1` })
      .where(inArray(mailOutbox.id, due))
      .returning();
  }

  async function runOnce(): Promise<OutboxRunResult> {
    const result = { sent: 0, retrying: 0, failed: 0 };
    const rows = await claim(clock());
    for (const row of rows) {
      const mine = and(eq(mailOutbox.id, row.id), eq(mailOutbox.claimToken, row.claimToken!));
      try {
        const attachments = row.attachments.map((a) => ({
          filename: a.filename,
          contentType: a.contentType,
          content: fs.readFileSync(path.join(opts.dataDir, a.path)),
        }));
        await mailer.send({ to: row.to, subject: row.subject, text: row.text, html: row.html, attachments, messageId: row.messageId });
        // The 'sent' mark and its audit row together (ISO/IEC 17025:2017 §7.5: every e-mail sent is recorded).
        await db.transaction(async (tx) => {
          const done = await tx.update(mailOutbox).set({ status: 'sent', sentAt: clock(), lastError: null, claimToken: null }).where(mine).returning({ id: mailOutbox.id });
          if (done.length) {
            await recordAudit(tx, {
              actor: null,
              action: 'send_email',
              entity: 'mail',
              entityId: row.id,
              after: { to: row.to, subject: row.subject, messageId: row.messageId, attempts: row.attempts, attachments: row.attachments.map((a) => ({ filename: a.filename, sha256: a.sha256 })) },
              at: clock(),
            });
          }
        });
        result.sent++;
      } catch (err) {
        const message = err instanceof Error ? err.message : String(err);
        const giveUp = row.attempts >= maxAttempts;
        await db
          .update(mailOutbox)
          .set({
            status: giveUp ? 'failed' : 'queued',
            lastError: message.slice(0, 2000),
            nextAttemptAt: new Date(clock().getTime() + retryDelayMs(row.attempts, baseDelay, maxDelay)),
            claimToken: null,
          })
          .where(mine);
        if (giveUp) result.failed++;
        else result.retrying++;
        logger.warn(giveUp ? 'mail failed, giving up' : 'mail not sent, will retry', { id: row.id, attempts: row.attempts, error: message });
      }
    }
    return result;
  }

  function schedule(delay: number) {
    if (stopped) return;
    if (timer) clearTimeout(timer);
    timer = setTimeout(tick, delay);
    timer.unref();
  }

  function tick() {
    timer = null;
    if (current) return schedule(intervalMs);
    current = runOnce()
      .catch((err) => logger.error('outbox run failed', { error: err }))
      .finally(() => {
        current = null;
        schedule(intervalMs);
      });
  }

  async function resend(id: string, tx: Db = db) {
    const [row] = await tx.select().from(mailOutbox).where(eq(mailOutbox.id, id));
    if (!row) return null;
    if (row.status === 'sent' || row.status === 'sending') {
      const copy = await enqueue(
        {
          to: row.to,
          subject: row.subject,
          text: row.text,
          html: row.html ?? undefined,
          attachments: row.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, content: fs.readFileSync(path.join(opts.dataDir, a.path)) })),
        },
        tx,
      );
      return { ...copy, copied: true };
    }
    await tx.update(mailOutbox).set({ status: 'queued', attempts: 0, nextAttemptAt: clock(), claimToken: null }).where(eq(mailOutbox.id, id));
    return { id: row.id, messageId: row.messageId, copied: false };
  }

  return {
    enqueue,
    runOnce,
    resend,
    start(ms = 5_000) {
      intervalMs = ms;
      stopped = false;
      schedule(0);
    },
    kick() {
      if (!stopped && !current) schedule(0);
    },
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      timer = null;
      if (current) await current;
    },
  };
}
