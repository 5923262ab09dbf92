/**
 * The e-mail log (quality managers, admins): every outbox row with its status, attempts and last
 * error, and resend. The local mailbox (admins, only while the fake SMTP server receives the mail,
 * i.e. SMTP_HOST unset) shows what it captured, with the attachments to download.
 */
import path from 'node:path';
import { desc, eq } from 'drizzle-orm';
import { recordAudit } from '../../audit';
import { auditActor } from '../../audit/actor';
import type { Db } from '../../db/client';
import { mailOutbox } from '../../db/schema';
import { NotFoundError } from '../../errors/app-error';
import { readMailbox } from '../../mail/fake-smtp';
import type { Outbox } from '../../mail/outbox';
import type { MailboxMessage, OutboxRow } from '../../../shared/schemas/certificates-api.schema';
import type { CertificatesRepository } from '../certificates/certificates.repository';
import type { Actor } from '../certificates/certificates.service';

export function createMailAdminService(deps: { db: Db; outbox: Outbox; certificatesRepo: CertificatesRepository; clock: () => Date; dataDir: string; fakeSmtp: boolean }) {
  const { db } = deps;
  const mailboxDir = path.join(deps.dataDir, 'mailbox');

  return {
    async list(limit = 200): Promise<OutboxRow[]> {
      const rows = await db.select().from(mailOutbox).orderBy(desc(mailOutbox.createdAt)).limit(limit);
      const numbers = await deps.certificatesRepo.certificateNumbersOfMails(rows.map((r) => r.id));
      return rows.map((r) => ({
        id: r.id,
        to: r.to,
        subject: r.subject,
        status: r.status,
        attempts: r.attempts,
        lastError: r.lastError,
        nextAttemptAt: r.nextAttemptAt.toISOString(),
        sentAt: r.sentAt?.toISOString() ?? null,
        createdAt: r.createdAt.toISOString(),
        attachments: r.attachments.map((a) => ({ filename: a.filename, size: a.size })),
        certificateNumber: numbers.get(r.id) ?? null,
      }));
    },

    async resend(id: string, actor: Actor) {
      if (!/^[0-9a-f-]{36}$/i.test(id)) throw new NotFoundError('There is no such message.');
      const now = deps.clock();
      const out = await db.transaction(async (tx) => {
        const done = await deps.outbox.resend(id, tx);
        if (!done) throw new NotFoundError('There is no such message.');
        if (done.copied) {
          const certificateId = await deps.certificatesRepo.certificateOfMail(id, tx);
          const [row] = await tx.select({ to: mailOutbox.to }).from(mailOutbox).where(eq(mailOutbox.id, done.id));
          if (certificateId) await deps.certificatesRepo.insertMail(tx, { certificateId, outboxId: done.id, recipient: row.to.join(', '), createdAt: now });
        }
        await recordAudit(tx, { actor: auditActor(actor), action: 'resend_email', entity: 'mail', entityId: id, after: { outboxId: done.id, copied: done.copied }, at: now });
        return done;
      });
      deps.outbox.kick();
      return out;
    },

    mailboxAvailable: () => deps.fakeSmtp,

    async mailbox(): Promise<MailboxMessage[]> {
      if (!deps.fakeSmtp) return [];
      const list = await readMailbox(mailboxDir);
      return list.reverse().map((m) => ({
        id: m.id,
        receivedAt: m.receivedAt.toISOString(),
        from: m.envelope.from,
        to: m.envelope.to,
        subject: m.subject,
        text: m.text,
        attachments: m.attachments.map((a, index) => ({ index, filename: a.filename, contentType: a.contentType, size: a.content.length })),
      }));
    },

    async attachment(id: string, index: number) {
      if (!deps.fakeSmtp || !/^[\w-]+$/.test(id)) throw new NotFoundError('There is no such message.');
      const m = (await readMailbox(mailboxDir)).find((x) => x.id === id);
      const a = m?.attachments[index];
      if (!a) throw new NotFoundError('There is no such attachment.');
      return { filename: a.filename ?? `attachment-${index + 1}`, contentType: a.contentType, content: a.content };
    },
  };
}

export type MailAdminService = ReturnType<typeof createMailAdminService>;
