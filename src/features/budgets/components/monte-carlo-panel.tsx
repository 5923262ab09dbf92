import { useEffect, useRef, useState } from 'react';
import { formatNumber } from '../../../../shared/format/number';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { cancelRun, startMonteCarlo } from '../../jobs/api/points';

type Progress = { done: number; target: number; elapsedMs: number };

/**
 * Runs Monte Carlo on the server (worker pool) and follows it with server-sent events: trials
 * done, elapsed time and a cancel button. `beforeRun` saves the budget first.
 */
export function MonteCarloPanel({ pointId, defaultTrials, disabled, beforeRun, onDone }: { pointId: string; defaultTrials: number; disabled?: boolean; beforeRun: () => Promise<void>; onDone: () => void }) {
  const [trials, setTrials] = useState(defaultTrials);
  const [run, setRun] = useState<{ id: string; seed: number } | null>(null);
  const [progress, setProgress] = useState<Progress | null>(null);
  const [message, setMessage] = useState<{ tone: 'ok' | 'warn' | 'danger'; text: string } | null>(null);
  const source = useRef<EventSource | null>(null);

  useEffect(() => () => source.current?.close(), []);

  async function start() {
    setMessage(null);
    try {
      await beforeRun();
      const r = await startMonteCarlo(pointId, { trials });
      setRun({ id: r.runId, seed: r.seed });
      setProgress({ done: 0, target: r.trials, elapsedMs: 0 });
      const es = new EventSource(`/api/runs/${r.runId}/events`);
      source.current = es;
      es.addEventListener('progress', (e) => setProgress(JSON.parse((e as MessageEvent).data)));
      const end = (tone: 'ok' | 'warn' | 'danger', text: string) => {
        es.close();
        setRun(null);
        setMessage({ tone, text });
      };
      es.addEventListener('done', (e) => {
        const d = JSON.parse((e as MessageEvent).data);
        setProgress({ done: d.result.mcm.trials, target: d.result.mcm.trials, elapsedMs: d.elapsedMs });
        end('ok', `Monte Carlo finished: ${formatNumber(d.result.mcm.trials, { decimals: 0, notation: 'fixed' })} trials in ${formatNumber(d.elapsedMs / 1000, { digits: 3 })} s (seed ${d.result.mcm.seed}). The result is stored with the point.`);
        onDone();
      });
      es.addEventListener('cancelled', () => end('warn', 'The run was cancelled; the previous result is unchanged.'));
      es.addEventListener('failed', (e) => end('danger', JSON.parse((e as MessageEvent).data).message));
      es.onerror = () => {
        if (es.readyState === EventSource.CLOSED) end('danger', 'The connection to the run was lost. Reload the page to see whether it finished.');
      };
    } catch (err) {
      setMessage({ tone: 'danger', text: err instanceof ApiError ? err.message : 'The run could not be started.' });
    }
  }

  const pct = progress && progress.target > 0 ? Math.min(100, (progress.done / progress.target) * 100) : 0;
  return (
    <section aria-labelledby="mc-heading" className="rounded-card border border-line bg-surface p-4">
      <div className="flex flex-wrap items-end gap-3">
        <h3 id="mc-heading" className="mr-auto text-base font-semibold">Monte Carlo (JCGM 101)</h3>
        <label className="flex items-center gap-2 text-sm">
          Trials
          <select className="rounded-field border border-line-strong bg-surface px-2 py-1 font-mono" value={trials} onChange={(e) => setTrials(Number(e.target.value))} disabled={Boolean(run)}>
            {[100_000, 1_000_000, 2_000_000, 10_000_000].map((n) => (
              <option key={n} value={n}>{formatNumber(n, { decimals: 0, notation: 'fixed' })}</option>
            ))}
          </select>
        </label>
        {run ? (
          <Button variant="secondary" onClick={() => void cancelRun(run.id)}>Cancel run</Button>
        ) : (
          <Button onClick={() => void start()} disabled={disabled}>Run Monte Carlo</Button>
        )}
      </div>
      {progress && (
        <div className="mt-3" aria-live="polite">
          <div role="progressbar" aria-label="Monte Carlo progress" aria-valuemin={0} aria-valuemax={progress.target} aria-valuenow={progress.done} className="h-3 w-full overflow-hidden rounded-pill bg-sunken">
            <div className="h-3 bg-ember transition-[width]" style={{ width: `${pct}%` }} />
          </div>
          <p className="mt-1 font-mono text-xs tabular-nums text-ink-muted" data-testid="mc-progress">
            {formatNumber(progress.done, { decimals: 0, notation: 'fixed' })} of {formatNumber(progress.target, { decimals: 0, notation: 'fixed' })} trials · {formatNumber(progress.elapsedMs / 1000, { digits: 3, notation: 'fixed' })} s{run ? ` · seed ${run.seed}` : ''}
          </p>
        </div>
      )}
      {message && (
        <Notice className="mt-3" tone={message.tone} label={message.tone === 'ok' ? 'Done' : message.tone === 'warn' ? 'Cancelled' : 'Problem'} role="status">
          {message.text}
        </Notice>
      )}
    </section>
  );
}
