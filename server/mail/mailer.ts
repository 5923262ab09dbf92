import nodemailer from 'nodemailer';
import type { SmtpConfig } from '../config/env';

export type MailAttachment = { filename: string; contentType: string; content: Buffer };

export type OutgoingMail = {
  to: string[];
  subject: string;
  text: string;
  html?: string | null;
  attachments?: MailAttachment[];
  /** Fixed per message so a repeated delivery can be recognised (RFC 5322 §3.6.4). */
  messageId: string;
};

export type Mailer = {
  readonly from: string;
  send(mail: OutgoingMail): Promise<{ messageId: string }>;
  close(): void;
};

/** nodemailer over SMTP. Without `smtp` it targets the local fake SMTP server on `fakePort`. */
export function createMailer(opts: { from: string; smtp?: SmtpConfig; fakePort?: number }): Mailer {
  const transport = opts.smtp
    ? nodemailer.createTransport({
        host: opts.smtp.host,
        port: opts.smtp.port,
        secure: opts.smtp.secure,
        auth: opts.smtp.user ? { user: opts.smtp.user, pass: opts.smtp.pass ?? '' } : undefined,
        connectionTimeout: 15_000,
        greetingTimeout: 15_000,
        socketTimeout: 30_000,
      })
    : nodemailer.createTransport({
        host: '127.0.0.1',
        port: opts.fakePort ?? 2525,
        secure: false,
        ignoreTLS: true,
        connectionTimeout: 5_000,
        greetingTimeout: 5_000,
        socketTimeout: 15_000,
      });
  return {
    from: opts.from,
    async send(mail) {
      const info = await transport.sendMail({
        from: opts.from,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        html: mail.html ?? undefined,
        messageId: mail.messageId,
        attachments: mail.attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, content: a.content })),
      });
      return { messageId: info.messageId };
    },
    close: () => transport.close(),
  };
}
