/**
 * How a job says that it amends an issued certificate (ISO/IEC 17025:2017 §7.8.8): a notice at
 * the top of the job page and a short mark in the jobs list. The wording follows the review page
 * (src/features/review/components/review-page.tsx), so analyst and signatory read the same thing.
 */
import type { JobAmends } from '../../../../shared/schemas/jobs.schema';
import { Notice } from '../../../components/ui/notice';
import { NoBreak } from '../../../components/ui/no-break';
import { withoutFinalStop } from '../../../lib/sentence';


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

/** In the jobs list, under the job number. */
export function AmendmentMark({ amends }: { amends: JobAmends }) {
  return (
    <div className="font-sans text-xs text-ink-muted" title={`Reason: ${withoutFinalStop(amends.reason)}.`}>
      Amends <NoBreak>{amends.certificateNumber}</NoBreak>
    </div>
  );
}
