import { useState } from 'react';
import { useSearchParams } from 'react-router';
import { formatNumber } from '../../../../shared/format/number';
import { formatUnit } from '../../../../shared/format/units';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { RefreshProblem } from '../../../components/ui/refresh-problem';
import { ApiError } from '../../../lib/api-client';
import { BudgetEditor } from '../../budgets/components/budget-editor';
import { ErrorAcrossJobChart } from '../../budgets/components/charts';
import { useChecks, useJob, useStandards, useSubmitJob } from '../api/jobs';
import { savePoint, useAddPoint, useRemovePoint } from '../api/points';
import type { Reason } from '../api/types';
import { AmendedByNotice, AmendmentNotice } from './amendment';
import { isClosed, JobStatusBadge } from './job-status';
import { PointRecord } from './point-record';

/**
 * One job: its details, points, the budget editor of the chosen point, the checks and submission.
 * A closed job (approved or issued) says so in one line instead of the checks, and shows each
 * point as a record: its inputs and scope as text, its budget, stored result and charts, and no
 * control, since none could ever be used again. It asks for neither its checks (what a check
 * would refuse today says nothing about it) nor the register of standards (nothing is picked).
 */
export function JobPage({ jobId, userId, today }: { jobId: string; userId: string; today: string }) {
  const job = useJob(jobId);
  // Known once the job has loaded: until then neither is asked for.
  const status = job.data?.job.status;
  const open = status !== undefined && !isClosed(status);
  const checks = useChecks(jobId, open);
  const standards = useStandards(open);
  const add = useAddPoint(jobId);
  const remove = useRemovePoint(jobId);
  const submit = useSubmitJob(jobId);
  const [params, setParams] = useSearchParams();
  const [nominal, setNominal] = useState('');
  const [refused, setRefused] = useState<Reason[] | null>(null);
  const [message, setMessage] = useState<{ tone: 'ok' | 'danger'; text: string } | null>(null);

  if (job.isPending) return <p className="text-ink-muted">Loading the job…</p>;
  if (!job.data) {
    const missing = job.error instanceof ApiError && job.error.status === 404;
    return <Notice tone="danger" label={missing ? 'There is no such job' : 'The job could not be loaded'} role="alert">{job.error?.message}</Notice>;
  }
  const { job: j, template, points } = job.data;
  const editable = j.status === 'draft' && j.analystId === userId;
  const closed = isClosed(j.status);
  const selected = points.find((p) => p.id === params.get('point')) ?? points[0];
  // What a check would refuse today (a standard since overdue…) says nothing about a closed job.
  const reasons = closed ? [] : (refused ?? checks.data?.reasons ?? []);
  // The checks are asked for once the job is known to be open: until they answer, nothing is said to pass.
  const checked = refused !== null || checks.data !== undefined;
  const refetchAll = () => Promise.all([job.refetch(), ...(closed ? [] : [checks.refetch()])]);
  const def = template.definition;
  const basis = def.cmc?.basis ? def.inputs.find((i) => i.symbol === def.cmc!.basis) : undefined;
  const nominalUnit = basis?.displayUnit ?? basis?.unit ?? def.measurand.unit ?? '';

  async function doSubmit() {
    setMessage(null);
    try {
      await submit.mutateAsync();
      setRefused(null);
      setMessage({ tone: 'ok', text: 'Submitted for review. The job can no longer be changed unless the reviewer sends it back.' });
    } catch (err) {
      if (err instanceof ApiError && err.code === 'SUBMIT_REFUSED') {
        setRefused(err.issues.map((i) => ({ code: String(i.path[3]), message: i.message, pointId: i.path[1] === '-' ? null : String(i.path[1]), pointPosition: null, symbol: i.path[2] === '-' ? null : String(i.path[2]) })));
        setMessage({ tone: 'danger', text: err.message });
      } else setMessage({ tone: 'danger', text: err instanceof Error ? err.message : String(err) });
    }
  }

  return (
    <div className="flex flex-col gap-5">
      <title>{`${j.number} · Emberline`}</title>
      <RefreshProblem error={job.isError ? job.error : null} onRetry={() => job.refetch()} what="this job" />
      <header className="flex flex-wrap items-start gap-4">
        <div className="mr-auto">
          <h1 className="flex items-center gap-3 text-2xl font-semibold"><span className="font-mono">{j.number}</span> <JobStatusBadge status={j.status} /></h1>
          <p className="mt-1 text-sm text-ink-muted">{j.customer} · {j.itemLabel}</p>
          <p className="text-sm text-ink-muted">{template.name}, version {template.version}</p>
        </div>
        <dl className="grid grid-cols-[auto_auto] gap-x-3 text-sm">
          <dt className="text-ink-muted">Received</dt><dd className="font-mono">{j.receivedOn ?? '—'}</dd>
          <dt className="text-ink-muted">Calibrated</dt><dd className="font-mono">{j.calibratedOn ?? '—'}</dd>
          <dt className="text-ink-muted">Location</dt><dd>{j.location || '—'}</dd>
          <dt className="text-ink-muted">Environment</dt>
          <dd className="font-mono tabular-nums">
            {j.environment.temperature ? `${j.environment.temperature.value} °C${j.environment.temperature.u !== undefined ? ` (u = ${j.environment.temperature.u} °C)` : ''}` : '—'}
            {j.environment.humidity ? `; relative humidity ${j.environment.humidity.value} %${j.environment.humidity.u !== undefined ? ` (u = ${j.environment.humidity.u} %)` : ''}` : ''}
          </dd>
        </dl>
      </header>

      {closed && (
        <p className="rounded-card border border-line bg-sunken px-4 py-2 text-sm" data-testid="job-closed">
          <span className="font-semibold">Closed:</span> {j.status === 'issued' ? 'the certificate has been issued from this job' : 'this job has been approved'}, and its points can no longer be changed. A new certificate can only come from an amendment, which opens a new draft copy of the job.
        </p>
      )}
      {j.amends && <AmendmentNotice amends={j.amends} />}
      {j.amendedBy && <AmendedByNotice amendedBy={j.amendedBy} />}

      {j.reviewComment && j.status === 'draft' && (
        <Notice tone="warn" label="Sent back by the reviewer">{j.reviewComment}</Notice>
      )}

      <section aria-labelledby="points-heading" className="rounded-card border border-line bg-surface p-4">
        <div className="flex flex-wrap items-end gap-3">
          <h2 id="points-heading" className="mr-auto text-lg font-semibold">Calibration points</h2>
          {editable && (
            <form className="flex items-end gap-2" onSubmit={(e) => { e.preventDefault(); const v = Number(nominal.replace(',', '.')); if (nominal.trim() && Number.isFinite(v)) void add.mutateAsync({ nominalValue: v, nominalUnit }).then((r) => { setNominal(''); setParams({ point: r.point.id }); }); }}>
              <label className="flex flex-col gap-1 text-sm font-semibold">
                Nominal value / {formatUnit(nominalUnit)}
                <input className="w-32 rounded-field border border-line-strong px-2 py-1 font-mono" inputMode="decimal" value={nominal} onChange={(e) => setNominal(e.target.value)} />
              </label>
              <Button type="submit" variant="secondary" disabled={add.isPending}>Add point</Button>
            </form>
          )}
        </div>
        {points.length === 0 ? (
          <p className="mt-3 text-sm text-ink-muted">No points yet. Add the first calibration point by its nominal value.</p>
        ) : (
          <ul className="mt-3 flex flex-wrap gap-2" role="tablist" aria-label="Points">
            {points.map((p) => {
              const n = reasons.filter((r) => r.pointId === p.id).length;
              return (
                <li key={p.id} className="flex items-center">
                  <button type="button" role="tab" aria-selected={p.id === selected?.id} className={`rounded-l-field border px-3 py-1.5 text-sm ${p.id === selected?.id ? 'border-ember-strong bg-ember-soft font-semibold' : 'border-line-strong bg-surface'}`} onClick={() => setParams({ point: p.id })}>
                    Point {p.position}: <span className="font-mono">{formatNumber(p.nominalValue)} {formatUnit(p.nominalUnit)}</span>
                    {p.reported && <span className="ml-2 font-mono text-xs">{p.result!.reported.value} ± {p.result!.reported.U} {formatUnit(p.result!.unit)}</span>}
                    {!closed && checked && <span className={`ml-2 text-xs ${n ? 'text-danger' : 'text-ok'}`}>{n ? `${n} to fix` : '✓ ready'}</span>}
                  </button>
                  {editable && (
                    <button type="button" aria-label={`Remove point ${p.position}`} className="rounded-r-field border border-l-0 border-line-strong px-2 py-1.5 text-sm hover:bg-sunken" onClick={() => { if (window.confirm(`Remove point ${p.position} with its readings and result?`)) void remove.mutateAsync(p.id); }}>✕</button>
                  )}
                </li>
              );
            })}
          </ul>
        )}
        {selected && (
          <div className="mt-3 flex gap-3 text-sm">
            <a className="text-ember-strong underline" href={`/api/points/${selected.id}/export?format=csv`}>Point budget as CSV</a>
            <a className="text-ember-strong underline" href={`/api/points/${selected.id}/export?format=xlsx`}>as XLSX</a>
            <a className="text-ember-strong underline" href={`/api/jobs/${j.id}/export?format=csv`}>Whole job as CSV</a>
            <a className="text-ember-strong underline" href={`/api/jobs/${j.id}/export?format=xlsx`}>as XLSX</a>
          </div>
        )}
      </section>

      {selected && (closed ? (
        <ScopeRecord outsideScope={selected.outsideScope} reason={selected.outsideScopeReason} />
      ) : (
        <PointScope key={`scope-${selected.id}`} pointId={selected.id} outsideScope={selected.outsideScope} reason={selected.outsideScopeReason} editable={editable} onSaved={refetchAll} />
      ))}

      {selected && (closed ? (
        <PointRecord key={selected.id} point={selected} definition={def} standards={job.data.standards} />
      ) : (
        <BudgetEditor key={selected.id} point={selected} definition={def} standards={standards.data?.standards ?? job.data.standards} reasons={reasons} today={today} editable={editable} onSaved={refetchAll} />
      ))}

      {points.filter((p) => p.reported).length >= 2 && (
        <section className="rounded-card border border-line bg-surface p-4">
          <h2 className="text-lg font-semibold">{def.certificate.resultLabel} across the job</h2>
          <ErrorAcrossJobChart points={points.filter((p) => p.reported).map((p) => ({ nominal: p.nominalValue, y: p.reported!.y, U: p.reported!.U }))} unit={def.measurand.unit ?? ''} nominalUnit={nominalUnit} label={def.certificate.resultLabel} />
        </section>
      )}

      {!closed && (
        <section aria-labelledby="submit-heading" className="rounded-card border border-line bg-surface p-4">
          <h2 id="submit-heading" className="text-lg font-semibold">Checks before review</h2>
          {!checked ? (
            <p className="mt-1 text-sm text-ink-muted">{checks.isError ? `The checks could not be run: ${checks.error.message}` : 'Running the checks…'}</p>
          ) : reasons.length === 0 ? (
            <p className="mt-1 text-sm text-ok">✓ Every check passes.</p>
          ) : (
            <ul className="mt-1 flex flex-col gap-1 text-sm" aria-label="What to fix before submitting">
              {reasons.map((r) => (
                <li key={`${r.pointId}-${r.symbol}-${r.code}`} className="text-danger">✕ {r.message}</li>
              ))}
            </ul>
          )}
          {checks.data?.notes.map((n) => (
            <p key={`${n.pointId}-${n.code}-${n.message}`} className="mt-1 text-sm text-warn">⚠ {n.message}</p>
          ))}
          {editable && (
            <Button className="mt-3" onClick={() => void doSubmit()} disabled={submit.isPending}>Submit for review</Button>
          )}
          {message && <Notice className="mt-3" tone={message.tone} label={message.tone === 'ok' ? 'Submitted' : 'Not submitted'} role="status">{message.text}</Notice>}
        </section>
      )}
    </div>
  );
}

/** Whether a closed job's point is within the scope of accreditation, as a line of text. */
function ScopeRecord({ outsideScope, reason }: { outsideScope: boolean; reason: string | null }) {
  return (
    <p className="rounded-card border border-line bg-surface px-4 py-2 text-sm" data-testid="scope-record">
      <span className="font-semibold">Scope of accreditation:</span>{' '}
      {outsideScope ? <>this point is outside the scope. Reason, printed on the certificate: {reason || '—'}</> : 'this point is within the scope.'}
    </p>
  );
}

function PointScope({ pointId, outsideScope, reason, editable, onSaved }: { pointId: string; outsideScope: boolean; reason: string | null; editable: boolean; onSaved: () => Promise<unknown> }) {
  const [on, setOn] = useState(outsideScope);
  const [text, setText] = useState(reason ?? '');
  const [error, setError] = useState<string | null>(null);
  const save = async () => {
    setError(null);
    try {
      await savePoint(pointId, { outsideScope: on, outsideScopeReason: on ? text : null });
      await onSaved();
    } catch (err) {
      setError(err instanceof ApiError ? (err.issues[0]?.message ?? err.message) : String(err));
    }
  };
  return (
    <details className="rounded-card border border-line bg-surface px-4 py-2" open={outsideScope}>
      <summary className="cursor-pointer text-sm font-semibold">Scope of accreditation {outsideScope ? '· outside the scope' : ''}</summary>
      <div className="mt-2 flex flex-wrap items-end gap-3 text-sm">
        <label className="flex items-center gap-2"><input type="checkbox" checked={on} disabled={!editable} onChange={(e) => setOn(e.target.checked)} /> This point is outside the scope of accreditation</label>
        <label className="flex flex-1 flex-col gap-1">Reason (printed on the certificate)<input className="rounded-field border border-line-strong px-2 py-1" value={text} disabled={!editable || !on} onChange={(e) => setText(e.target.value)} /></label>
        <Button variant="secondary" disabled={!editable} onClick={() => void save()}>Save</Button>
      </div>
      {error && <p className="mt-1 text-sm text-danger">✕ {error}</p>}
    </details>
  );
}
