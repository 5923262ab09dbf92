import { useState, type DragEvent, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/text-field';
import { certificateStatusText, type PublicCertificate } from '../../../../shared/schemas/certificates-api.schema';
import { useVerifyFile, useVerifyNumber } from '../api/verify';

function Header({ c }: { c: PublicCertificate }) {
  return (
    <dl className="mt-2 grid grid-cols-[10rem_1fr] gap-x-3 gap-y-1">
      <dt className="font-semibold">Certificate</dt>
      <dd>{c.number}</dd>
      <dt className="font-semibold">Issued on</dt>
      <dd>{c.issueDate}</dd>
      <dt className="font-semibold">Laboratory</dt>
      <dd>{c.lab}</dd>
      <dt className="font-semibold">Customer</dt>
      <dd>{c.customer}</dd>
      <dt className="font-semibold">Status</dt>
      <dd data-testid="verify-status">
        {certificateStatusText(c)}
        {c.withdrawnOn ? ` on ${c.withdrawnOn}` : ''}
      </dd>
    </dl>
  );
}

const tone = (c: PublicCertificate) => (c.status === 'current' ? 'ok' : 'warn') as 'ok' | 'warn';

/** Check a certificate: drop or choose the PDF (its fingerprint is compared), or enter its number. */
export function VerifyCertificate() {
  const file = useVerifyFile();
  const byNumber = useVerifyNumber();
  const [number, setNumber] = useState('');
  const [numberError, setNumberError] = useState<string | null>(null);
  const [dragging, setDragging] = useState(false);

  const check = (f: File | undefined | null) => {
    if (!f) return;
    file.mutate(f);
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    check(e.dataTransfer.files[0]);
  };
  const submitNumber = (e: FormEvent) => {
    e.preventDefault();
    setNumberError(null);
    if (number.trim().length < 3) return setNumberError('Enter the certificate number as printed at the top of each page.');
    byNumber.mutate(number);
  };

  return (
    <div className="mt-8 grid gap-6 md:grid-cols-2">
      <section aria-labelledby="verify-file" className="space-y-3">
        <h2 id="verify-file" className="text-lg font-semibold">Check the PDF file</h2>
        <div
          onDragOver={(e) => {
            e.preventDefault();
            setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDrop={onDrop}
          className={`rounded-card border-2 border-dashed p-6 text-center ${dragging ? 'border-ember bg-sunken' : 'border-line-strong bg-surface'}`}
        >
          <p>Drop the certificate PDF here, or</p>
          <label className="mt-2 inline-block cursor-pointer font-semibold text-ember-strong underline">
            choose the file
            <input type="file" accept="application/pdf,.pdf" className="sr-only" onChange={(e) => check(e.target.files?.[0])} aria-label="Certificate PDF file" />
          </label>
          <p className="mt-2 text-xs text-ink-muted">The file is checked on this server and not kept. At most 10 MB.</p>
        </div>
        {file.isPending && <p role="status">Checking the file…</p>}
        {file.isError && <Notice tone="danger" label="The file could not be checked" role="alert">{file.error.message}</Notice>}
        {file.data &&
          (file.data.authentic && file.data.certificate ? (
            <Notice tone={tone(file.data.certificate)} label="Authentic: this is the file the laboratory issued" role="status">
              <Header c={file.data.certificate} />
              {file.data.certificate.status !== 'current' && <p className="mt-2">This certificate is no longer current{file.data.certificate.supersededBy ? `: use ${file.data.certificate.supersededBy} instead` : ''}.</p>}
            </Notice>
          ) : (
            <Notice tone="danger" label="Not authentic: no issued certificate has exactly this file" role="status">
              <p>The file differs from every certificate issued here, even if it looks the same: it may have been altered, re-saved or printed to PDF. Ask the laboratory for the original.</p>
              <p className="mt-1 break-all text-xs text-ink-muted">SHA-256 of the file: {file.data.sha256}</p>
            </Notice>
          ))}
      </section>
      <section aria-labelledby="verify-number" className="space-y-3">
        <h2 id="verify-number" className="text-lg font-semibold">Look up a certificate number</h2>
        <form onSubmit={submitNumber} className="space-y-3" aria-label="Look up a certificate number">
          <TextField label="Certificate number" placeholder="EMB-C-2026-0001" value={number} onChange={(e) => setNumber(e.target.value)} error={numberError ?? undefined} />
          <Button type="submit" disabled={byNumber.isPending}>
            Look up
          </Button>
        </form>
        {byNumber.isError && <Notice tone="danger" label="The number could not be looked up" role="alert">{byNumber.error.message}</Notice>}
        {byNumber.data &&
          (byNumber.data.certificate ? (
            <Notice tone={tone(byNumber.data.certificate)} label="A certificate with this number was issued here" role="status">
              <Header c={byNumber.data.certificate} />
              <p className="mt-2 text-xs">A number alone does not prove a copy is genuine: check the PDF file itself on the left.</p>
            </Notice>
          ) : (
            <Notice tone="warn" label="No certificate with this number was issued here" role="status">
              Check the number as printed at the top of each page, or ask the laboratory.
            </Notice>
          ))}
      </section>
    </div>
  );
}
