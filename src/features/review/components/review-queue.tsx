import { Link } from 'react-router';
import { EmptyState } from '../../../components/ui/empty-state';
import { Notice } from '../../../components/ui/notice';
import { useReviewQueue } from '../api/review';
import { formatDateTimeUtc } from '../../../../shared/format/date';

/** Jobs submitted for review, oldest first. */
export function ReviewQueue() {
  const q = useReviewQueue();
  if (q.isPending) return <p className="text-ink-muted">Loading the jobs awaiting review…</p>;
  if (q.isError && q.data === undefined) return <Notice tone="danger" label="The queue could not be loaded" role="alert">{q.error.message}</Notice>;
  if (q.data.length === 0) {
    return (
      <EmptyState title="Nothing awaits review">
        <p>When an analyst submits a job, it appears here. Open it to read the budgets, the checks and the certificate it would produce, then approve or send it back.</p>
      </EmptyState>
    );
  }
  return (
    <table className="w-full border-collapse text-sm">
      <caption className="sr-only">Jobs awaiting review</caption>
      <thead>
        <tr className="border-b border-line-strong text-left">
          <th className="py-2 pr-3">Job</th>
          <th className="py-2 pr-3">Customer</th>
          <th className="py-2 pr-3">Item</th>
          <th className="py-2 pr-3">Analyst</th>
          <th className="py-2 pr-3 text-right">Points</th>
          <th className="py-2 pr-3">Submitted</th>
        </tr>
      </thead>
      <tbody>
        {q.data.map((j) => (
          <tr key={j.jobId} className="border-b border-line align-top">
            <td className="py-2 pr-3">
              <Link className="whitespace-nowrap font-semibold text-ember-strong underline" to={`/app/review/${j.jobId}`}>
                {j.jobNumber}
              </Link>
              {j.amends && <div className="text-xs text-ink-muted">Amends {j.amends.certificateNumber}</div>}
            </td>
            <td className="py-2 pr-3">{j.customer}</td>
            <td className="py-2 pr-3">{j.itemLabel}</td>
            <td className="py-2 pr-3">{j.analyst}</td>
            <td className="py-2 pr-3 text-right tabular-nums">{j.points}</td>
            <td className="whitespace-nowrap py-2 pr-3 tabular-nums">{formatDateTimeUtc(j.submittedAt)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
