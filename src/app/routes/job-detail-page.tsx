/**
 * /app/jobs/:jobId, a module of its own: the router loads it on demand (./router.tsx), with the
 * budget editor, the engine's live GUM evaluation and the charts, none of which the jobs list needs.
 */
import { useParams } from 'react-router';
import { JobPage } from '../../features/jobs/components/job-page';
import { useMe } from '../../features/session/api/get-me';
import { ForbiddenPage } from './forbidden';

const READERS = ['analyst', 'quality_manager', 'signatory'];

/** /app/jobs/:jobId — analysts work on it; quality managers and signatories read it. */
export function JobDetailPage() {
  const { user } = useMe();
  const { jobId = '' } = useParams();
  if (!user.role || !READERS.includes(user.role)) return <ForbiddenPage what="Calibration job" />;
  // Keyed by the job: a link from one job to another (an amendment's) starts the page afresh.
  return <JobPage key={jobId} jobId={jobId} userId={user.id} today={new Date().toISOString().slice(0, 10)} />;
}
