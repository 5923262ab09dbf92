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

/**
 * Whether a job is closed: approved or issued, it never returns to draft (a reviewer can only send
 * back a submitted job), so its points can no longer be changed; a new certificate comes from an
 * amendment, a new draft copy of the job (ISO/IEC 17025:2017 §7.8.8).
 */
export function isClosed(status: JobStatus): boolean {
  return status === 'approved' || status === 'issued';
}
