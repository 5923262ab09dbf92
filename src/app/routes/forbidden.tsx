import { Link } from 'react-router';
import { useMe } from '../../features/session/api/get-me';
import { homePathFor } from '../navigation';
import { ROLE_LABELS } from '../../../shared/schemas/roles';

/** Shown inside the shell when a role opens a section that is not part of its work. */
export function ForbiddenPage({ what }: { what: string }) {
  const { user } = useMe();
  return (
    <div className="max-w-prose">
      <h1 className="text-2xl font-semibold">Not available to your role</h1>
      <p className="mt-2 text-ink-muted">
        {what} is not part of the work of {user.role ? `the ${ROLE_LABELS[user.role].toLowerCase()} role` : 'an account without a role'}.
        If you need it, ask an administrator to change your role.
      </p>
      {user.role && (
        <p className="mt-4">
          <Link to={homePathFor(user.role)}>Go to your start page</Link>
        </p>
      )}
    </div>
  );
}
