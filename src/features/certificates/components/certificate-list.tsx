import { useState, type FormEvent, type ReactNode } from 'react';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { NoBreak } from '../../../components/ui/no-break';
import { Notice } from '../../../components/ui/notice';
import { certificateStatusText, type CertificateRow } from '../../../../shared/schemas/certificates-api.schema';
import { ApiError } from '../../../lib/api-client';
import { useAmendCertificate, useCertificates } from '../api/certificates';

function AmendForm({ row, onDone }: { row: CertificateRow; onDone: (msg: ReactNode) => void }) {
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  const amend = useAmendCertificate();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (reason.trim().length < 5) return setError('Say why the certificate is amended (at least 5 characters).');
    amend.mutate(
      { id: row.id, reason: reason.trim() },
      {
        onSuccess: (r) =>
          onDone(
            <>
              The job <NoBreak>{r.jobNumber}</NoBreak> is a new draft revision for the analyst. <NoBreak>{row.number}</NoBreak> stays current until the new certificate is issued.
            </>,
          ),
        onError: (err) => setError(err instanceof ApiError ? err.message : 'The amendment could not be opened.'),
      },
    );
  };
  return (
    <form onSubmit={submit} aria-label={`Amend ${row.number}`} className="mt-2 space-y-2">
      <label htmlFor={`reason-${row.id}`} className="block text-sm font-semibold">
        Reason for the amendment (printed on the new certificate)
      </label>
      <textarea id={`reason-${row.id}`} rows={2} className="w-full rounded-field border border-line-strong bg-surface px-3 py-2 text-sm" value={reason} onChange={(e) => setReason(e.target.value)} aria-invalid={error ? true : undefined} />
      {error && <p role="alert" className="text-sm text-danger">{error}</p>}
      <p className="text-xs text-ink-muted">A new draft revision of the job is made; it is submitted and reviewed again. The new certificate gets a new number and names <NoBreak>{row.number}</NoBreak>, which is then superseded and never deleted.</p>
      <Button type="submit" variant="secondary" disabled={amend.isPending}>
        Open the amendment
      </Button>
    </form>
  );
}

/** The lab's issued certificates with their status, PDF and the amendment action. */
export function CertificateList({ canAmend }: { canAmend: boolean }) {
  const q = useCertificates();
  const [amending, setAmending] = useState<string | null>(null);
  const [message, setMessage] = useState<ReactNode>(null);
  if (q.isPending) return <p className="text-ink-muted">Loading the certificates…</p>;
  if (q.isError && q.data === undefined) return <Notice tone="danger" label="The certificates could not be loaded" role="alert">{q.error.message}</Notice>;
  if (q.data.length === 0) {
    return (
      <EmptyState title="No certificate issued yet">
        <p>A certificate is issued when an authorised signatory approves a job. It is listed here with its status and PDF.</p>
      </EmptyState>
    );
  }
  return (
    <div className="space-y-3">
      {message && <Notice tone="ok" label="Amendment opened" role="status">{message}</Notice>}
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Issued certificates</caption>
        <thead>
          <tr className="border-b border-line-strong text-left">
            <th className="py-2 pr-3">Certificate</th>
            <th className="py-2 pr-3">Customer and item</th>
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
                {c.amends && <div className="max-w-64 whitespace-normal text-xs font-normal text-ink-muted">Replaces <NoBreak>{c.amends}</NoBreak>: {c.amendReason}</div>}
              </td>
              <td className="py-2 pr-3">
                {c.customer}
                <div className="text-xs text-ink-muted">{c.itemLabel}</div>
              </td>
              <td className="py-2 pr-3 tabular-nums">
                {c.issueDate}
                <div className="text-xs text-ink-muted">by {c.signatoryName}</div>
              </td>
              <td className="py-2 pr-3">
                <span data-testid="certificate-status">{certificateStatusText(c)}</span>
                {c.openAmendment && <div className="text-xs text-ink-muted">Amendment in progress (job <NoBreak>{c.openAmendment.jobNumber}</NoBreak>)</div>}
                {canAmend && c.status === 'current' && !c.openAmendment && (
                  <div>
                    <button type="button" className="mt-1 text-xs text-ember-strong underline" onClick={() => setAmending(amending === c.id ? null : c.id)} aria-expanded={amending === c.id}>
                      Amend…
                    </button>
                    {amending === c.id && (
                      <AmendForm
                        row={c}
                        onDone={(m) => {
                          setAmending(null);
                          setMessage(m);
                        }}
                      />
                    )}
                  </div>
                )}
              </td>
              <td className="py-2 pr-3">
                <a className="whitespace-nowrap text-ember-strong underline" href={`/api/certificates/${c.id}/pdf`} download={`${c.number}.pdf`}>
                  Download {c.number}.pdf
                </a>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
