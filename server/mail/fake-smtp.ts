import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { simpleParser, type ParsedMail } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** A message the fake SMTP server received. */
export type CapturedMail = {
  /** File name (without .eml) under the mailbox folder; also a stable id for a mailbox page. */
  id: string;
  receivedAt: Date;
  envelope: { from: string | null; to: string[] };
  messageId: string | null;
  subject: string;
  text: string;
  html: string | null;
  attachments: Array<{ filename: string | null; contentType: string; content: Buffer }>;
  raw: Buffer;
};

export type FakeSmtp = {
  readonly port: number;
  readonly host: string;
  /** Messages received since start (newest last). */
  readonly messages: CapturedMail[];
  /** Resolves with the first message (already received or arriving later) that matches. */
  waitFor(match: (m: CapturedMail) => boolean): Promise<CapturedMail>;
  /** Stops listening; `messages` is kept. */
  stop(): Promise<void>;
  /** Listens again on the same port (after stop). */
  restart(): Promise<void>;
};

/**
 * A local SMTP server standing in for a real one (SMTP_HOST unset, and in tests): it accepts any
 * mail on 127.0.0.1 without authentication or TLS, keeps each message in memory and, when
 * `mailboxDir` is given, as an .eml file there (readable again with `readMailbox`).
 */
export async function startFakeSmtp(opts: { port?: number; mailboxDir?: string } = {}): Promise<FakeSmtp> {
  const host = '127.0.0.1';
  const messages: CapturedMail[] = [];
  const waiters: Array<{ match: (m: CapturedMail) => boolean; resolve: (m: CapturedMail) => void }> = [];
  if (opts.mailboxDir) fs.mkdirSync(opts.mailboxDir, { recursive: true });

  const receive = (raw: Buffer, envelope: CapturedMail['envelope']) => {
    const receivedAt = new Date();
    const id = `${receivedAt.toISOString().replace(/[:.]/g, '-')}-${crypto.randomBytes(4).toString('hex')}`;
    if (opts.mailboxDir) fs.writeFileSync(path.join(opts.mailboxDir, `${id}.eml`), raw);
    return simpleParser(raw).then((parsed) => {
      const mail = toCaptured(id, receivedAt, envelope, parsed, raw);
      messages.push(mail);
      for (const w of [...waiters]) {
        if (w.match(mail)) {
          waiters.splice(waiters.indexOf(w), 1);
          w.resolve(mail);
        }
      }
    });
  };

  let server: SMTPServer;
  let port = opts.port ?? 0;
  const listen = async () => {
    server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      logger: false,
      banner: 'Emberline local test mail server',
      onData(stream, session, callback) {
        const chunks: Buffer[] = [];
        stream.on('data', (c: Buffer) => chunks.push(c));
        stream.on('end', () => {
          const envelope = {
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
            to: session.envelope.rcptTo.map((r) => r.address),
          };
          receive(Buffer.concat(chunks), envelope).then(() => callback(), (err: Error) => callback(err));
        });
      },
    });
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, host, () => {
        server.off('error', reject);
        port = (server.server.address() as AddressInfo).port;
        resolve();
      });
    });
  };
  await listen();
  let running = true;

  return {
    get port() {
      return port;
    },
    host,
    messages,
    waitFor(match) {
      const found = messages.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve) => waiters.push({ match, resolve }));
    },
    async stop() {
      if (!running) return;
      running = false;
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
    async restart() {
      if (running) return;
      await listen();
      running = true;
    },
  };
}

function toCaptured(id: string, receivedAt: Date, envelope: CapturedMail['envelope'], p: ParsedMail, raw: Buffer): CapturedMail {
  return {
    id,
    receivedAt,
    envelope,
    messageId: p.messageId ?? null,
    subject: p.subject ?? '',
    text: p.text ?? '',
    html: typeof p.html === 'string' ? p.html : null,
    attachments: p.attachments.map((a) => ({ filename: a.filename ?? null, contentType: a.contentType, content: a.content })),
    raw,
  };
}

/** Reads the .eml files a fake SMTP server left in `mailboxDir` (oldest first). */
export async function readMailbox(mailboxDir: string): Promise<CapturedMail[]> {
  if (!fs.existsSync(mailboxDir)) return [];
  const files = fs.readdirSync(mailboxDir).filter((f) => f.endsWith('.eml')).sort();
  const out: CapturedMail[] = [];
  for (const f of files) {
    const raw = fs.readFileSync(path.join(mailboxDir, f));
    const parsed = await simpleParser(raw);
    const to = parsed.to ? (Array.isArray(parsed.to) ? parsed.to : [parsed.to]).flatMap((a) => a.value.map((v) => v.address ?? '')) : [];
    out.push(toCaptured(f.replace(/\.eml$/, ''), parsed.date ?? fs.statSync(path.join(mailboxDir, f)).mtime, { from: parsed.from?.value[0]?.address ?? null, to }, parsed, raw));
  }
  return out;
}
