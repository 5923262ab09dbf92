import { EmptyState } from '../../../components/ui/empty-state';
import { Notice } from '../../../components/ui/notice';
import { Button } from '../../../components/ui/button';
import { useMailbox, useOutbox, useResend } from '../api/mail';
import { formatDateTimeUtc } from '../../../../shared/format/date';

const STATUS_WORDS = { queued: 'Waiting to be sent', sending: 'Sending', sent: 'Sent', failed: 'Failed: gave up' } as const;

/** Every outgoing message with its delivery status, attempts and last error; resend. */
export function MailLog() {
  const q = useOutbox();
  const resend = useResend();
  if (q.isPending) return <p className="text-ink-muted">Loading the e-mail log…</p>;
  if (q.isError && q.data === undefined) return <Notice tone="danger" label="The e-mail log could not be loaded" role="alert">{q.error.message}</Notice>;
  if (q.data.length === 0) {
    return (
      <EmptyState title="No e-mail sent">
        <p>Once a certificate is issued, the message to each of the customer’s contacts is listed here with its delivery result.</p>
      </EmptyState>
    );
  }
  return (
    <table className="w-full border-collapse text-sm">
      <caption className="sr-only">E-mail log</caption>
      <thead>
        <tr className="border-b border-line-strong text-left">
          <th className="py-2 pr-3">Queued</th>
          <th className="py-2 pr-3">To</th>
          <th className="py-2 pr-3">Subject and attachment</th>
          <th className="py-2 pr-3">Status</th>
          <th className="py-2 pr-3 text-right">Attempts</th>
          <th className="py-2 pr-3">Action</th>
        </tr>
      </thead>
      <tbody>
        {q.data.map((m) => (
          <tr key={m.id} className="border-b border-line align-top">
            <td className="py-2 pr-3 tabular-nums">{formatDateTimeUtc(m.createdAt)}</td>
            <td className="py-2 pr-3 break-all">{m.to.join(', ')}</td>
            <td className="py-2 pr-3">
              {m.subject}
              {m.attachments.map((a) => (
                <div key={a.filename} className="text-xs text-ink-muted">
                  {a.filename} ({Math.round(a.size / 1024)} kB)
                </div>
              ))}
            </td>
            <td className="py-2 pr-3">
              {STATUS_WORDS[m.status]}
              {m.status === 'sent' && <div className="text-xs text-ink-muted">{formatDateTimeUtc(m.sentAt)}</div>}
              {m.status === 'queued' && m.attempts > 0 && <div className="text-xs text-ink-muted">next try {formatDateTimeUtc(m.nextAttemptAt)}</div>}
              {m.lastError && m.status !== 'sent' && <div className="text-xs text-danger">Last error: {m.lastError}</div>}
            </td>
            <td className="py-2 pr-3 text-right tabular-nums">{m.attempts}</td>
            <td className="py-2 pr-3">
              <Button variant="secondary" className="px-2 py-1 text-xs" disabled={resend.isPending} onClick={() => resend.mutate(m.id)}>
                {m.status === 'sent' ? 'Send again' : 'Try now'}
              </Button>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** What the built-in test mail server received (admins; only while no real SMTP server is configured). */
export function Mailbox() {
  const q = useMailbox(true);
  if (q.isPending) return <p className="text-ink-muted">Loading the local mailbox…</p>;
  if (q.isError && q.data === undefined) return <Notice tone="danger" label="The local mailbox could not be loaded" role="alert">{q.error.message}</Notice>;
  if (!q.data.available) return <Notice tone="info" label="No local mailbox">Mail goes to the SMTP server configured with SMTP_HOST; nothing is kept here.</Notice>;
  if (q.data.messages.length === 0) return <EmptyState title="The local mailbox is empty"><p>Messages the built-in test mail server receives appear here.</p></EmptyState>;
  return (
    <ul className="space-y-3">
      {q.data.messages.map((m) => (
        <li key={m.id} className="rounded-card border border-line bg-surface p-4 text-sm" aria-label={`Message to ${m.to.join(', ')}: ${m.subject}`}>
          <p className="font-semibold">{m.subject}</p>
          <p className="text-ink-muted">
            To {m.to.join(', ')} · received {formatDateTimeUtc(m.receivedAt)}
          </p>
          <pre className="mt-2 whitespace-pre-wrap font-sans">{m.text}</pre>
          {m.attachments.map((a) => (
            <a key={a.index} className="mt-2 inline-block text-ember-strong underline" href={`/api/mail/mailbox/${encodeURIComponent(m.id)}/attachments/${a.index}`} download={a.filename ?? undefined}>
              Download {a.filename ?? 'attachment'} ({Math.round(a.size / 1024)} kB)
            </a>
          ))}
        </li>
      ))}
    </ul>
  );
}
