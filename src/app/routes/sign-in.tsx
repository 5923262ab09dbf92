import { useQueryClient } from '@tanstack/react-query';
import { useNavigate, useSearchParams } from 'react-router';
import { meQueryOptions } from '../../features/session/api/get-me';
import { sessionKeys } from '../../features/session/api/keys';
import { SignInForm } from '../../features/session/components/sign-in-form';
import { homePathFor, safeNextPath } from '../navigation';

export function SignInPage() {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const [params] = useSearchParams();

  async function afterSignIn() {
    queryClient.removeQueries({ queryKey: sessionKeys.all });
    const me = await queryClient.fetchQuery(meQueryOptions());
    if (!me.user.role) {
      navigate('/app', { replace: true });
      return;
    }
    navigate(safeNextPath(params.get('next'), me.user.role) ?? homePathFor(me.user.role), { replace: true });
  }

  return (
    <div className="mx-auto flex max-w-md flex-col px-6 py-14">
      <title>Sign in · Emberline</title>
      <div className="rounded-card border border-line bg-surface p-8 shadow-card">
        <h1 id="sign-in-heading" className="text-2xl font-semibold">
          Sign in
        </h1>
        <p className="mt-2 mb-6 text-sm text-ink-muted">
          Use the account your laboratory’s administrator created for you. Customers sign in with the address the
          laboratory sends certificates to.
        </p>
        <SignInForm onSignedIn={afterSignIn} />
      </div>
      <p className="mt-4 text-xs text-ink-muted">Forgotten password or no account? Ask the laboratory’s administrator; accounts are not created from this page.</p>
    </div>
  );
}
