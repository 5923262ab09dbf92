import { Link, useParams } from 'react-router';
import { Notice } from '../../components/ui/notice';
import { useCustomer } from '../../features/customers/api/customers';
import { CustomerDetail } from '../../features/customers/components/customer-detail';
import { CustomerList } from '../../features/customers/components/customer-list';
import { useMe } from '../../features/session/api/get-me';
import { canOpen, SECTIONS } from '../navigation';
import { ForbiddenPage } from './forbidden';
import { PageHeader } from './page-header';

const canManage = (role: string | null) => role === 'quality_manager' || role === 'admin';

/** /app/customers. */
export function CustomersPage() {
  const { user } = useMe();
  const section = SECTIONS.customers;
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  return (
    <>
      <title>{`${section.label} · Emberline`}</title>
      <PageHeader title={section.label} viewOnly={!canManage(user.role)}>
        Organisations the lab calibrates for, the people who receive their certificates, and the instruments they send.
      </PageHeader>
      <CustomerList canEdit={canManage(user.role)} />
    </>
  );
}

/** /app/customers/:id. */
export function CustomerPage() {
  const { user } = useMe();
  const { id = '' } = useParams();
  const q = useCustomer(id);
  const section = SECTIONS.customers;
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  if (q.isPending) return <p role="status" className="text-sm text-ink-muted">Loading the customer…</p>;
  if (q.isError && q.data === undefined) return <Notice tone="danger" label="This customer could not be loaded" role="alert">{q.error.message}</Notice>;
  return (
    <>
      <title>{`${q.data.organisation} · Emberline`}</title>
      <Link to="/app/customers" className="text-sm font-semibold text-ember underline-offset-2 hover:underline">← All customers</Link>
      <PageHeader title={q.data.organisation} viewOnly={!canManage(user.role)}>{q.data.address.split('\n').join(', ')}</PageHeader>
      <CustomerDetail customer={q.data} canEdit={canManage(user.role)} />
    </>
  );
}
