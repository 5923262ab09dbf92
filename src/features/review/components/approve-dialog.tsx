import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { ApiError } from '../../../lib/api-client';
import { useApproveJob, useRejectJob } from '../api/review';

/**
 * Approval as an electronic signature: says what will be frozen, asks for the password again,
 * and issues the certificate.
 */
export function ApproveForm({ jobId, jobNumber, disabled, onIssued }: { jobId: string; jobNumber: string; disabled: boolean; onIssued: (number: string) => void }) {
  const [password, setPassword] = useState('');
  const [error, setError] = useState<string | null>(null);
  const approve = useApproveJob(jobId);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setError(null);
    if (!password) return setError('Enter your password to sign the approval.');
    approve.mutate(password, {
      onSuccess: (c) => onIssued(c.number),
      onError: (err) => setError(err instanceof ApiError ? err.message : 'The approval could not be sent. Try again.'),
    });
  };

  return (
    <form onSubmit={submit} aria-label="Approve and issue" className="space-y-3 rounded-card border border-line-strong bg-surface p-4">
      <h3 className="text-base font-semibold">Approve and issue the certificate</h3>
      <p className="text-sm">
        Approving job {jobNumber} signs it with your name and issues the certificate at once: it gets its number, the PDF is signed with the
        laboratory’s key, and the certificate, its PDF and its fingerprint are frozen. It is e-mailed to the customer’s contacts. Later changes need
        an amendment, which issues a new certificate.
      </p>
      <TextField label="Your password (electronic signature)" type="password" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} error={error ?? undefined} disabled={disabled || approve.isPending} />
      <Button type="submit" disabled={disabled || approve.isPending}>
        {approve.isPending ? 'Issuing the certificate…' : 'Approve and issue'}
      </Button>
      {disabled && <p className="text-sm text-ink-muted">Approval is not possible until the points listed above are resolved.</p>}
    </form>
  );
}

export function RejectForm({ jobId, disabled, onRejected }: { jobId: string; disabled: boolean; onRejected: () => void }) {
  const [comment, setComment] = useState('');
  const [error, setError] = useState<string | null>(null);
  const reject = useRejectJob(jobId);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    setError(null);
    if (comment.trim().length < 3) return setError('Say what the analyst should correct (at least 3 characters).');
    reject.mutate(comment.trim(), { onSuccess: onRejected, onError: (err) => setError(err instanceof ApiError ? err.message : 'The job could not be sent back. Try again.') });
  };
  return (
    <form onSubmit={submit} aria-label="Send back to the analyst" className="space-y-3 rounded-card border border-line-strong bg-surface p-4">
      <h3 className="text-base font-semibold">Send back to the analyst</h3>
      <label htmlFor="review-comment" className="block text-sm font-semibold">
        Comment for the analyst
      </label>
      <textarea id="review-comment" rows={3} className="w-full rounded-field border border-line-strong bg-surface px-3 py-2" value={comment} onChange={(e) => setComment(e.target.value)} disabled={disabled || reject.isPending} aria-invalid={error ? true : undefined} aria-describedby={error ? 'review-comment-error' : undefined} />
      {error && <p id="review-comment-error" role="alert" className="text-sm text-danger">{error}</p>}
      <Button type="submit" variant="secondary" disabled={disabled || reject.isPending}>
        Send back with this comment
      </Button>
    </form>
  );
}

