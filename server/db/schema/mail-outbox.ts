import { index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/** A file attached to an outgoing message; the bytes live in a file under DATA_DIR. */
export type OutboxAttachment = {
  filename: string;
  contentType: string;
  size: number;
  sha256: string;
  /** Path relative to DATA_DIR. */
  path: string;
};

export const MAIL_STATUSES = ['queued', 'sending', 'sent', 'failed'] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

/**
 * Outgoing e-mail. Rows are written in the same transaction as the event that causes them and
 * sent by the outbox loop (server/mail/outbox.ts). `messageId` is fixed at enqueue time, so a
 * message re-sent after a crash carries the same Message-ID and receivers can drop the duplicate.
 */
export const mailOutbox = pgTable(
  'mail_outbox',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    messageId: text('message_id').notNull().unique(),
    to: jsonb('to').$type<string[]>().notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    html: text('html'),
    attachments: jsonb('attachments').$type<OutboxAttachment[]>().notNull().default([]),
    status: text('status').$type<MailStatus>().notNull().default('queued'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    nextAttemptAt: timestamp('next_attempt_at', { withTimezone: true }).notNull().defaultNow(),
    /** Set when a sender claims the row; a claim older than the lease is taken over. */
    claimedAt: timestamp('claimed_at', { withTimezone: true }),
    claimToken: uuid('claim_token'),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('mail_outbox_due_idx').on(t.status, t.nextAttemptAt)],
);
