import { useParams } from 'react-router';
import { JobList } from '../../features/jobs/components/job-list';
import { JobPage } from '../../features/jobs/components/job-page';
import { NewJobForm } from '../../features/jobs/components/new-job-form';
import { useMe } from '../../features/session/api/get-me';
import { canOpen, SECTIONS } from '../navigation';
import { ForbiddenPage } from './forbidden';
import { PageHeader } from './page-header';

const READERS = ['analyst', 'quality_manager', 'signatory'];

/** /app/jobs: the analyst's calibration jobs. */
export function JobsPage() {
  const { user } = useMe();
  const section = SECTIONS.jobs;
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  return (
    <>
      <title>{`${section.label} · Emberline`}</title>
      <PageHeader title={section.label}>Each job is one customer’s item calibrated with a released measurement model: open it, fill the budget of each point, run the calculation and submit it for review.</PageHeader>
      <JobList canCreate={user.role === 'analyst'} />
    </>
  );
}

/** /app/jobs/new */
export function NewJobPage() {
  const { user } = useMe();
  if (user.role !== 'analyst') return <ForbiddenPage what="New job" />;
  return (
    <>
      <title>New job · Emberline</title>
      <PageHeader title="New calibration job">Choose the customer, the item they sent and the released measurement model; the dates, location and conditions can be completed later while the job is a draft.</PageHeader>
      <NewJobForm />
    </>
  );
}

/** /app/jobs/:jobId — analysts work on it; quality managers and signatories read it. */
export function JobDetailPage() {
  const { user } = useMe();
  const { jobId = '' } = useParams();
  if (!user.role || !READERS.includes(user.role)) return <ForbiddenPage what="Calibration job" />;
  // Keyed by the job: a link from one job to another (an amendment's) starts the page afresh.
  return <JobPage key={jobId} jobId={jobId} userId={user.id} today={new Date().toISOString().slice(0, 10)} />;
}
