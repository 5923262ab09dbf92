import { JobList } from '../../features/jobs/components/job-list';
import { NewJobForm } from '../../features/jobs/components/new-job-form';
import { useMe } from '../../features/session/api/get-me';
import { canOpen, SECTIONS } from '../navigation';
import { ForbiddenPage } from './forbidden';
import { PageHeader } from './page-header';

/** /app/jobs: the analyst's calibration jobs. The job page is ./job-detail-page, loaded on its own. */
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
