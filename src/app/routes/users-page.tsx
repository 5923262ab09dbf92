import { useCustomers } from '../../features/customers/api/customers';
import { useMe } from '../../features/session/api/get-me';
import { UserAdmin } from '../../features/users/components/user-admin';
import { canOpen, SECTIONS } from '../navigation';
import { ForbiddenPage } from './forbidden';
import { PageHeader } from './page-header';

/** /app/users (admin). */
export function UsersPage() {
  const { user } = useMe();
  const customers = useCustomers();
  const section = SECTIONS.users;
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  return (
    <>
      <title>{`${section.label} · Emberline`}</title>
      <PageHeader title={section.label}>
        Who may sign in and what each person may do. There is always at least one active administrator.
      </PageHeader>
      <UserAdmin customers={customers.data ?? []} meId={user.id} />
    </>
  );
}
