import { useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { PASSWORD_MIN_LENGTH } from '../../../shared/schemas/users.schema';
import { Button } from '../../components/ui/button';
import { Notice } from '../../components/ui/notice';
import { TextField } from '../../components/ui/text-field';
import { useAcceptInvitation, useInvitation } from '../../features/users/api/users';

/** /set-password?token=…: the one-time link from an invitation or reset e-mail. */
export function SetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const info = useInvitation(token);
  const accept = useAcceptInvitation();
  const [pw, setPw] = useState('');
  const [again, setAgain] = useState('');
  const [mismatch, setMismatch] = useState(false);
  return (
    <div className="mx-auto max-w-md space-y-4 py-10">
      <title>Choose your password · Emberline</title>
      <h1 className="text-2xl font-semibold text-ink">Choose your password</h1>
      {token.length < 20 && <Notice tone="danger" label="The link is not complete" role="alert">Open the link from the e-mail again, or ask an administrator for a new one.</Notice>}
      {info.isPending && token.length >= 20 && <p role="status" className="text-sm text-ink-muted">Checking the link…</p>}
      {info.error && <Notice tone="danger" label="This link does not work" role="alert">{info.error.message}</Notice>}
      {accept.isSuccess ? (
        <Notice tone="ok" label="Password set" role="status">
          You can now <Link className="font-semibold underline" to="/sign-in">sign in</Link> with your e-mail and the new password.
        </Notice>
      ) : (
        info.data && (
          <form
            className="space-y-4 rounded-card border border-line bg-surface p-5"
            onSubmit={(e) => {
              e.preventDefault();
              if (pw !== again) return setMismatch(true);
              setMismatch(false);
              accept.mutate({ token, password: pw });
            }}
          >
            <p className="text-sm">For <b>{info.data.name}</b>, signing in as <span className="font-mono">{info.data.email}</span>.</p>
            <TextField label="New password" type="password" autoComplete="new-password" value={pw} onChange={(e) => setPw(e.target.value)} hint={`At least ${PASSWORD_MIN_LENGTH} characters.`} />
            <TextField label="The same password again" type="password" autoComplete="new-password" value={again} onChange={(e) => setAgain(e.target.value)} error={mismatch ? 'The two passwords differ.' : undefined} />
            {accept.error && <Notice tone="danger" label="Password not set" role="alert">{accept.error.message}</Notice>}
            <Button type="submit" disabled={accept.isPending}>Set password</Button>
          </form>
        )
      )}
    </div>
  );
}
