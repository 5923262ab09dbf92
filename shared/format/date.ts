/**
 * Dates and times on screen: ISO 8601 calendar dates (2026-12-02) and times in UTC to the minute
 * or second, with "UTC" written out (ISO 8601-1:2019 §5.2.2 and §5.3.3; the audit trail, the
 * stored results and the certificate state UTC, so every screen does too).
 */

/** "2026-12-02" from an ISO timestamp or date; "—" when there is none. */
export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '—';
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : d.toISOString().slice(0, 10);
}

/** "2026-12-02 15:14 UTC" (or with seconds: "2026-12-02 15:14:34 UTC"); "—" when there is none. */
export function formatDateTimeUtc(iso: string | null | undefined, opts: { seconds?: boolean } = {}): string {
  if (!iso) return '—';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return `${d.toISOString().slice(0, opts.seconds ? 19 : 16).replace('T', ' ')} UTC`;
}
