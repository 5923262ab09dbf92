import { JOB_STATUS_LABELS, type JobStatus } from '../../../../shared/schemas/jobs.schema';

const STYLE: Record<JobStatus, string> = {
  draft: 'border-line-strong bg-sunken text-ink',
  submitted: 'border-info bg-info-soft text-ink',
  approved: 'border-ok bg-ok-soft text-ink',
  issued: 'border-ok bg-ok-soft text-ink',
};

/** The status in words (colour only repeats it). */
export function JobStatusBadge({ status }: { status: JobStatus }) {
  return <span className={`whitespace-nowrap rounded-pill border px-2 py-0.5 text-xs font-semibold ${STYLE[status]}`}>{JOB_STATUS_LABELS[status]}</span>;
}
