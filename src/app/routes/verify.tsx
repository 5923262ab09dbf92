import { Notice } from '../../components/ui/notice';

/** Public certificate check. The lookup itself is built with the certificates feature. */
export function VerifyPage() {
  return (
    <div className="mx-auto max-w-5xl px-6 py-12">
      <title>Check a certificate · Emberline</title>
      <h1 className="text-2xl font-semibold">Check a calibration certificate</h1>
      <p className="mt-3 max-w-prose text-ink-muted">
        A certificate issued through Emberline carries a certificate number and a fingerprint (SHA-256) of the
        signed PDF. Checking them here confirms that the laboratory issued that exact file, and whether a later
        certificate has replaced it.
      </p>
      <Notice tone="info" label="Online checking is not available on this installation yet" className="mt-6 max-w-prose">
        To confirm a certificate now, contact the issuing laboratory with its certificate number. The digital
        signature inside the PDF can also be inspected with any PDF reader that shows signatures.
      </Notice>
    </div>
  );
}
