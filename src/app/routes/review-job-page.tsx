/**
 * /app/review/:jobId, a module of its own: the router loads it on demand (./router.tsx), with the
 * review of one job (budgets, certificate preview, approval), which the review queue does not need.
 */
import { useParams } from 'react-router';
import { ReviewJobPage } from '../../features/review/components/review-page';
import { useMe } from '../../features/session/api/get-me';
import { canOpen, SECTIONS } from '../navigation';
import { ForbiddenPage } from './forbidden';

export function ReviewJobRoute() {
  const { jobId = '' } = useParams();
  const { user } = useMe();
  if (!user.role || !canOpen(SECTIONS.review, user.role)) return <ForbiddenPage what={SECTIONS.review.label} />;
  return <ReviewJobPage jobId={jobId} />;
}
