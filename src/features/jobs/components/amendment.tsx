/**
 * How a job says that it amends an issued certificate (ISO/IEC 17025:2017 §7.8.8): a notice at
 * the top of the job page and a short mark in the jobs list. The wording follows the review page
 * (src/features/review/components/review-page.tsx), so analyst and signatory read the same thing.
 * The job whose certificate is being amended says so too, naming the draft that amends it.
 */
import { Link } from 'react-router';
import type { JobAmendedBy, JobAmends } from '../../../../shared/schemas/jobs.schema';
import { Notice } from '../../../components/ui/notice';
import { NoBreak } from '../../../components/ui/no-break';
import { withoutFinalStop } from '../../../lib/sentence';
import { JobStatusBadge } from './job-status';

/** At the top of the job page: which certificate the job amends, why, and what approval does to it. */
export function AmendmentNotice({ amends }: { amends: JobAmends }) {
  const old = amends.certificateNumber;
  if (amends.status === 'issued') {
    return (
      <Notice tone="info" label={`Amendment of certificate ${old}`}>
        <p>Reason: {withoutFinalStop(amends.reason)}.</p>
        <p className="mt-1">
          {amends.newCertificateNumber ? <>Certificate <NoBreak>{amends.newCertificateNumber}</NoBreak>, issued from this job, replaced <NoBreak>{old}</NoBreak>, which is now marked superseded.</> : <>The new certificate issued from this job replaced <NoBreak>{old}</NoBreak>, which is now marked superseded.</>}
        </p>
      </Notice>
    );
  }
  return (
    <Notice tone="warn" label={`Amendment of certificate ${old}`}>
      <p>Reason: {withoutFinalStop(amends.reason)}.</p>
      <p className="mt-1">
        This draft is a copy of the job behind <NoBreak>{old}</NoBreak>: change what the amendment needs, then submit it for review as usual. When an authorised signatory approves it, the new certificate replaces <NoBreak>{old}</NoBreak>, which is then marked superseded.
      </p>
    </Notice>
  );
}

/**
 * At the top of the page of the job whose certificate is amended: the job opened for the
 * amendment (a link) with its status, the reason, and what its approval does, or did, to this
 * job's certificate.
 */
export function AmendedByNotice({ amendedBy }: { amendedBy: JobAmendedBy }) {
  const old = amendedBy.certificateNumber;
  const job = (
    <>
      job <Link className="font-mono font-semibold text-ember-strong underline" to={`/app/jobs/${amendedBy.jobId}`}>{amendedBy.jobNumber}</Link> <JobStatusBadge status={amendedBy.jobStatus} />
    </>
  );
  if (amendedBy.status === 'issued') {
    return (
      <Notice tone="info" label={`Certificate ${old} was amended`}>
        <p>Amended by {job}. Reason: {withoutFinalStop(amendedBy.reason)}.</p>
        <p className="mt-1">
          {amendedBy.newCertificateNumber ? <>Certificate <NoBreak>{amendedBy.newCertificateNumber}</NoBreak>, issued from that job, replaced <NoBreak>{old}</NoBreak>, which is now marked superseded.</> : <>The new certificate issued from that job replaced <NoBreak>{old}</NoBreak>, which is now marked superseded.</>}
        </p>
      </Notice>
    );
  }
  return (
    <Notice tone="warn" label={`Certificate ${old} is being amended`}>
      <p>The amendment is prepared in {job}. Reason: {withoutFinalStop(amendedBy.reason)}.</p>
      <p className="mt-1">
        <NoBreak>{old}</NoBreak>, issued from this job, stays current until an authorised signatory approves the amendment; it is then marked superseded by the new certificate.
      </p>
    </Notice>
  );
}

/** In the jobs list, under the job number. */
export function AmendmentMark({ amends }: { amends: JobAmends }) {
  return (
    <div className="font-sans text-xs text-ink-muted" title={`Reason: ${withoutFinalStop(amends.reason)}.`}>
      Amends <NoBreak>{amends.certificateNumber}</NoBreak>
    </div>
  );
}
