/**
 * How a job says that it amends an issued certificate (ISO/IEC 17025:2017 §7.8.8): a notice at
 * the top of the job page and a short mark in the jobs list. The wording follows the review page
 * (src/features/review/components/review-page.tsx), so analyst and signatory read the same thing.
 * The job whose certificate is being amended says so too, naming the draft that amends it; each
 * job's notice links to the other.
 */
import { Link } from 'react-router';
import type { JobAmendedBy, JobAmends, JobListRow } from '../../../../shared/schemas/jobs.schema';
import { Notice } from '../../../components/ui/notice';
import { NoBreak } from '../../../components/ui/no-break';
import { withoutFinalStop } from '../../../lib/sentence';
import { JobStatusBadge } from './job-status';

/** The other job of an amendment, by its number, as a link to its page (also on the review page). */
export function JobLink({ id, number }: { id: string; number: string }) {
  return <Link className="font-mono font-semibold text-ember-strong underline" to={`/app/jobs/${id}`}>{number}</Link>;
}

/** Which certificate an amendment amends, the job it was issued from (a link) and why: the job page's and the review page's first sentences. */
export function AmendmentOrigin({ amends }: { amends: Pick<JobAmends, 'certificateNumber' | 'reason' | 'jobId' | 'jobNumber'> }) {
  return (
    <>
      Certificate <NoBreak>{amends.certificateNumber}</NoBreak> was issued from job <JobLink id={amends.jobId} number={amends.jobNumber} />. Reason: {withoutFinalStop(amends.reason)}.
    </>
  );
}

/**
 * At the top of the job page: which certificate the job amends and the job it was issued from (a
 * link), why, and what approval does to it.
 */
export function AmendmentNotice({ amends }: { amends: JobAmends }) {
  const old = amends.certificateNumber;
  const origin = <AmendmentOrigin amends={amends} />;
  if (amends.status === 'issued') {
    return (
      <Notice tone="info" label={`Amendment of certificate ${old}`}>
        <p>{origin}</p>
        <p className="mt-1">
          {amends.newCertificateNumber ? <>Certificate <NoBreak>{amends.newCertificateNumber}</NoBreak>, issued from this job, replaced <NoBreak>{old}</NoBreak>, which is now marked superseded.</> : <>The new certificate issued from this job replaced <NoBreak>{old}</NoBreak>, which is now marked superseded.</>}
        </p>
      </Notice>
    );
  }
  return (
    <Notice tone="warn" label={`Amendment of certificate ${old}`}>
      <p>{origin}</p>
      <p className="mt-1">
        This draft is a copy of that job: change what the amendment needs, then submit it for review as usual. When an authorised signatory approves it, the new certificate replaces <NoBreak>{old}</NoBreak>, which is then marked superseded.
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
      job <JobLink id={amendedBy.jobId} number={amendedBy.jobNumber} /> <JobStatusBadge status={amendedBy.jobStatus} />
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

/**
 * In the jobs list, under the job number: "Amends EMB-C-…" on an amendment; on the job whose
 * certificate is amended, the job preparing the amendment ("Being amended in EMB-…", then
 * "Amended by EMB-…"), the whole story in the tooltip.
 */
export function AmendmentMark({ amends, amendedBy }: Pick<JobListRow, 'amends' | 'amendedBy'>) {
  const quiet = 'font-sans text-xs text-ink-muted';
  const story = amendedBy && (amendedBy.status === 'issued'
    ? `Certificate ${amendedBy.certificateNumber} was replaced${amendedBy.newCertificateNumber ? ` by ${amendedBy.newCertificateNumber}` : ''}, issued from job ${amendedBy.jobNumber}`
    : `Certificate ${amendedBy.certificateNumber} is being amended in job ${amendedBy.jobNumber}`);
  return (
    <>
      {amends && (
        <div className={quiet} title={`Reason: ${withoutFinalStop(amends.reason)}.`}>
          Amends <NoBreak>{amends.certificateNumber}</NoBreak>
        </div>
      )}
      {amendedBy && (
        <div className={quiet} title={`${story}. Reason: ${withoutFinalStop(amendedBy.reason)}.`}>
          {amendedBy.status === 'issued' ? 'Amended by' : 'Being amended in'} <NoBreak>{amendedBy.jobNumber}</NoBreak>
        </div>
      )}
    </>
  );
}
