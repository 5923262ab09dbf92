import { useRef, useState } from 'react';
import type { StandardDetail } from '../../../../shared/schemas/standards.schema';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { certificateDownloadUrl, useUploadCertificate } from '../api/upload-certificate';

const kb = (n: number) => `${Math.max(1, Math.round(n / 1024))} kB`;

/** The standard's calibration certificate PDF: what is on file, and an upload (PDF by content, 10 MB at most). */
export function CertificateUpload({ standard, canEdit }: { standard: StandardDetail; canEdit: boolean }) {
  const upload = useUploadCertificate(standard.id);
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const f = standard.certificateFile;
  return (
    <section aria-labelledby="cert-file" className="space-y-3 rounded-card border border-line bg-surface p-4">
      <h2 id="cert-file" className="text-lg font-semibold text-ink">Certificate PDF</h2>
      {f ? (
        <p className="text-sm">
          <a className="font-semibold text-ember underline" href={certificateDownloadUrl(standard.id)}>{f.name}</a>{' '}
          <span className="text-ink-muted">({kb(f.size)}, uploaded {f.uploadedAt.slice(0, 10)})</span>
          <span className="mt-1 block break-all font-mono text-xs text-ink-muted">SHA-256 {f.sha256}</span>
        </p>
      ) : (
        <p className="text-sm text-ink-muted">No certificate file yet.</p>
      )}
      {canEdit && (
        <form
          className="flex flex-wrap items-end gap-3"
          onSubmit={async (e) => {
            e.preventDefault();
            if (!file) return;
            try {
              await upload.mutateAsync(file);
              setFile(null);
              if (input.current) input.current.value = '';
            } catch {
              /* shown below */
            }
          }}
        >
          <label className="flex flex-col gap-1 text-sm font-semibold text-ink">
            {f ? 'Replace with another PDF' : 'Choose the PDF'}
            <input ref={input} type="file" accept="application/pdf,.pdf" onChange={(e) => setFile(e.target.files?.[0] ?? null)} className="text-sm" />
          </label>
          <Button type="submit" variant="secondary" disabled={!file || upload.isPending}>{upload.isPending ? 'Uploading…' : 'Upload'}</Button>
          <p className="w-full text-xs text-ink-muted">PDF only (checked by its content), at most 10 MB. The file is kept under its SHA-256 fingerprint.</p>
        </form>
      )}
      {upload.error && <Notice tone="danger" label="Upload refused" role="alert">{upload.error.message}</Notice>}
      {upload.isSuccess && !upload.error && <Notice tone="ok" label="Uploaded" role="status">The certificate PDF is on file.</Notice>}
    </section>
  );
}
