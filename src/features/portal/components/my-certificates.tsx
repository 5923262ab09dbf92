import { EmptyState } from '../../../components/ui/empty-state';
import { Notice } from '../../../components/ui/notice';
import { certificateStatusText } from '../../../../shared/schemas/certificates-api.schema';
import { useMyCertificates } from '../api/portal';

/** A customer's certificates: status in words, and the PDF exactly as issued. */
export function MyCertificates() {
  const q = useMyCertificates();
  if (q.isPending) return <p className="text-ink-muted">Loading your certificates…</p>;
  if (q.isError && q.data === undefined) return <Notice tone="danger" label="Your certificates could not be loaded" role="alert">{q.error.message}</Notice>;
  if (q.data.length === 0) {
    return (
      <EmptyState title="No certificates yet">
        <p>When the laboratory issues a certificate for one of your instruments, it appears here and is also sent by e-mail to your organisation’s contacts.</p>
      </EmptyState>
    );
  }
  return (
    <table className="w-full border-collapse text-sm">
      <caption className="sr-only">Your organisation’s certificates</caption>
      <thead>
        <tr className="border-b border-line-strong text-left">
          <th className="py-2 pr-3">Certificate</th>
          <th className="py-2 pr-3">Instrument</th>
          <th className="py-2 pr-3">Issued</th>
          <th className="py-2 pr-3">Status</th>
          <th className="py-2 pr-3">PDF</th>
        </tr>
      </thead>
      <tbody>
        {q.data.map((c) => (
          <tr key={c.id} className="border-b border-line align-top">
            <td className="whitespace-nowrap py-2 pr-3 font-semibold">
              {c.number}
              {c.amends && <div className="text-xs font-normal text-ink-muted">Replaces {c.amends}</div>}
            </td>
            <td className="py-2 pr-3">{c.itemLabel}</td>
            <td className="whitespace-nowrap py-2 pr-3 tabular-nums">{c.issueDate}</td>
            <td className="whitespace-nowrap py-2 pr-3" data-testid="certificate-status">
              {certificateStatusText(c)}
              {c.status === 'superseded' && <div className="text-xs text-ink-muted">Use the newer certificate.</div>}
            </td>
            <td className="py-2 pr-3">
              <a className="whitespace-nowrap text-ember-strong underline" href={`/api/portal/certificates/${c.id}/pdf`} download={`${c.number}.pdf`}>
                Download {c.number}.pdf
              </a>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
