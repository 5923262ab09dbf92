import { AuditLog } from '../../features/audit/components/audit-log';
import { useMe } from '../../features/session/api/get-me';
import { canOpen, SECTIONS } from '../navigation';
import { ForbiddenPage } from './forbidden';
import { PageHeader } from './page-header';

/** /app/audit (quality manager, admin). */
export function AuditPage() {
  const { user } = useMe();
  const section = SECTIONS.audit;
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  return (
    <>
      <title>{`${section.label} · Emberline`}</title>
      <PageHeader title={section.label}>
        Every change to the lab’s records: who, when, and the record before and after. Entries cannot be edited or removed; each carries the SHA-256 of the one before, so “Verify chain” shows whether anything was altered outside the application.
      </PageHeader>
      <AuditLog />
    </>
  );
}
