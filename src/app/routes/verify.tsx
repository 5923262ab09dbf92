import { VerifyCertificate } from '../../features/verify/components/verify-certificate';

/** Public certificate check (no sign-in). */
export function VerifyPage() {
  return (
    <div className="mx-auto max-w-5xl px-6 py-12">
      <title>Check a certificate · Emberline</title>
      <h1 className="text-2xl font-semibold">Check a calibration certificate</h1>
      <p className="mt-3 max-w-prose text-ink-muted">
        A certificate issued through Emberline is a signed PDF whose fingerprint (SHA-256) the laboratory recorded when it was issued. Checking
        the file here confirms that it is exactly the file the laboratory issued, and whether a later certificate has replaced it. Only the
        certificate’s header is shown: its number, issue date, laboratory, customer and status.
      </p>
      <VerifyCertificate />
    </div>
  );
}
