import { Button } from './button';
import { Notice } from './notice';

/**
 * A background refresh failed while the page already shows data: say so above the page and keep
 * the page (and anything typed in it) instead of replacing it by an error.
 */
export function RefreshProblem({ error, onRetry, what }: { error: Error | null; onRetry: () => unknown; what: string }) {
  if (!error) return null;
  return (
    <Notice tone="warn" label={`The latest copy of ${what} could not be fetched`} role="status">
      <p>{error.message} What is shown may be out of date; nothing you typed has been lost.</p>
      <Button className="mt-2" variant="secondary" onClick={() => void onRetry()}>Try again</Button>
    </Notice>
  );
}
