import { useMe } from '../../features/session/api/get-me';

/** /app for an account that exists but has no role yet. */
export function NoRolePage() {
  const { user } = useMe();
  return (
    <div className="max-w-prose">
      <h1 className="text-2xl font-semibold">Your account has no role yet</h1>
      <p className="mt-2 text-ink-muted">
        You are signed in as {user.email}, but an administrator has not given this account a role, so there is
        nothing to open yet. Ask your laboratory’s administrator to assign one.
      </p>
    </div>
  );
}
