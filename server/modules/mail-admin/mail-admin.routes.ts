import { Router } from 'express';
import { z } from 'zod';
import { currentUser, requireRole } from '../../auth/require-role';
import { NotFoundError } from '../../errors/app-error';
import { validate } from '../../middleware/validate';
import type { MailAdminService } from './mail-admin.service';

const idParams = z.object({ id: z.string().min(1).max(100) });
const attachmentParams = z.object({ id: z.string().min(1).max(200), index: z.coerce.number().int().min(0).max(50) });

/** /api/mail: the outbox log with resend (quality managers, admins); the local mailbox (admins, fake SMTP only). */
export function mailAdminRoutes(mail: MailAdminService): Router {
  const r = Router();
  r.get('/outbox', requireRole('admin', 'quality_manager'), async (_req, res) => {
    res.json({ messages: await mail.list() });
  });
  r.post('/outbox/:id/resend', requireRole('admin', 'quality_manager'), validate({ params: idParams }), async (req, res) => {
    res.json(await mail.resend(String(req.params.id), currentUser(res)));
  });
  r.get('/mailbox', requireRole('admin'), async (_req, res) => {
    res.json({ available: mail.mailboxAvailable(), messages: await mail.mailbox() });
  });
  r.get('/mailbox/:id/attachments/:index', requireRole('admin'), validate({ params: attachmentParams }), async (req, res) => {
    if (!mail.mailboxAvailable()) throw new NotFoundError('The local mailbox is only there while the built-in test mail server receives the mail.');
    const { id, index } = req.params as unknown as { id: string; index: number };
    const a = await mail.attachment(id, index);
    res.setHeader('Content-Type', a.contentType);
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.attachment(a.filename);
    res.send(a.content);
  });
  return r;
}
