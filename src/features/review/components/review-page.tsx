import { useEffect, useRef, useState } from 'react';
import { Link } from 'react-router';
import { Cautions } from '../../../components/ui/cautions';
import { NoBreak } from '../../../components/ui/no-break';
import { Notice } from '../../../components/ui/notice';
import { RefreshProblem } from '../../../components/ui/refresh-problem';
import { formatCoverageProbability, formatNumber, formatResult, formatUnit, formatValueAndU, inDisplayUnit, sensitivityUnit } from '../../../../shared/format';
import { JOB_STATUS_LABELS, type JobStatus } from '../../../../shared/schemas/jobs.schema';
import { distributionLabel } from '../../budgets/components/units';
import { AmendmentOrigin } from '../../jobs/components/amendment';
import { Sym } from '../../templates/components/math-tex';
import { useReview } from '../api/review';
import { ApproveForm, RejectForm } from './approve-dialog';
import { CertificatePreview } from './certificate-preview';
import { UnitSlot } from '../../../components/ui/quantity';

type Reported = { method: string; y: number; U: number; k: number | null; note: string | null } | null;
type Result = {
  /** The measurand's symbol in the model (E, T_90 …). */
  measurand?: string;
  unit: string;
  gum: { y: number; u: number; U: number; k: number; coverage: number; budget: Array<{ symbol: string; estimate: number; u: number; c: number; contribution: number; share: number; distribution: string }> };
  mcm: { trials: number; y: number; u: number; interval: [number, number] } | null;
  validation: { passed: boolean; delta: number; dLow: number; dHigh: number } | null;
} | null;


/** Budget figures: four significant digits, × 10ⁿ outside 10⁻³ … 10⁶, U+2212 for negatives. */
const sig = (x: number) => formatNumber(x, { digits: 4 });

/** One job's review: what the certificate will say, the budgets, the validation and the checks; reject or approve. */
export function ReviewJobPage({ jobId }: { jobId: string }) {
  const q = useReview(jobId);
  const [issued, setIssued] = useState<string | null>(null);
  const [rejected, setRejected] = useState(false);
  // The forms are at the foot of a long page and vanish once used; the outcome is shown at the top.
  // Bring it into view and give it focus, or the signatory is left looking at the preview with no answer.
  const outcome = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!issued && !rejected) return;
    outcome.current?.scrollIntoView?.({ block: 'start' });
    outcome.current?.focus({ preventScroll: true });
  }, [issued, rejected]);
  if (q.isPending) return <p className="text-ink-muted">Loading the job…</p>;
  if (q.isError && q.data === undefined) return <Notice tone="danger" label="The job could not be loaded" role="alert">{q.error.message}</Notice>;
  const d = q.data;
  const open = d.job.status === 'submitted';
  return (
    <div className="space-y-6">
      <RefreshProblem error={q.isError ? q.error : null} onRetry={() => q.refetch()} what="this job" />
      <title>{`Review ${d.job.number} · Emberline`}</title>
      <div>
        <Link to="/app/review" className="text-sm text-ember-strong underline">
          Back to the jobs awaiting review
        </Link>
        <h1 className="mt-2 text-2xl font-semibold">Review of job {d.job.number}</h1>
        <p className="mt-1 text-ink-muted">
          {d.job.customer} · {d.job.itemLabel} · prepared by {d.job.analyst} · model “{d.template.name}”, version {d.template.version} · status: <strong className="text-ink">{JOB_STATUS_LABELS[d.job.status as JobStatus] ?? d.job.status}</strong>
        </p>
      </div>
      {(issued || rejected) && (
        <div ref={outcome} tabIndex={-1} className="scroll-mt-4 outline-none">
          {issued && (
            <Notice tone="ok" label={`Certificate ${issued} issued`} role="status">
              The signed PDF is stored and queued for e-mail to the customer’s contacts. <Link className="underline" to="/app/certificates">See the issued certificates</Link>.
            </Notice>
          )}
          {rejected && <Notice tone="info" label="Sent back to the analyst" role="status">The job is a draft again; the analyst sees your comment.</Notice>}
        </div>
      )}
      {d.amends && (
        <Notice tone="warn" label={`Amendment of certificate ${d.amends.certificateNumber}`}>
          {/* As the job's own page says it, with the same link back. */}
          <AmendmentOrigin amends={d.amends} /> When approved, the new certificate replaces <NoBreak>{d.amends.certificateNumber}</NoBreak>, which is then marked superseded.
        </Notice>
      )}
      <Cautions />
      {d.blocking.length > 0 && open && (
        <Notice tone="danger" label="Approval is not possible yet">
          <ul className="list-disc pl-5">
            {d.blocking.map((b, i) => (
              <li key={i}>{b.message}</li>
            ))}
          </ul>
        </Notice>
      )}
      {d.checks.notes.length > 0 && (
        <Notice tone="info" label="Notes from the checks">
          <ul className="list-disc pl-5">
            {d.checks.notes.map((n, i) => (
              <li key={i}>{n.message}</li>
            ))}
          </ul>
        </Notice>
      )}
      <section aria-labelledby="budgets-heading" className="space-y-4">
        <h2 id="budgets-heading" className="text-xl font-semibold">Points, budgets and validation</h2>
        {d.points.map((p) => {
          const r = p.result as Result;
          const rep = p.reported as Reported;
          return (
            <div key={p.id} className="rounded-card border border-line bg-surface p-4 text-sm">
              <h3 className="font-semibold">
                Point {p.position}: nominal {p.nominal}
                {p.outsideScope ? ' · outside the scope of accreditation' : ''}
              </h3>
              {!r ? (
                <p className="text-danger">No result yet.</p>
              ) : (
                <>
                  <p className="mt-1 font-mono tabular-nums">
                    {r.measurand && (
                      <>
                        <Sym name={r.measurand} className="font-sans" /> ={' '}
                      </>
                    )}
                    {rep && rep.k !== null ? formatResult(rep.y, rep.U, r.unit, rep.k, r.gum.coverage) : rep ? `${formatValueAndU(rep.y, rep.U, r.unit)} (Monte Carlo interval, ${formatCoverageProbability(r.gum.coverage)})` : ''}
                    {' · '}result {p.current ? 'current' : 'out of date'}
                  </p>
                  <p className="mt-1">
                    GUM against Monte Carlo (JCGM 101 §8):{' '}
                    {r.validation ? (r.validation.passed ? `passed (δ = ${sig(r.validation.delta)}, d_low = ${sig(r.validation.dLow)}, d_high = ${sig(r.validation.dHigh)} ${formatUnit(r.unit)})` : 'not passed: the Monte Carlo result is reported') : 'not run'}
                    {r.mcm ? ` · ${formatNumber(r.mcm.trials, { decimals: 0, notation: 'fixed' })} trials` : ''}
                  </p>
                  <table className="mt-2 w-full border-collapse">
                    <caption className="sr-only">Uncertainty budget of point {p.position}</caption>
                    <thead>
                      <tr className="border-b border-line-strong text-left">
                        <th className="py-1 pr-2">Quantity</th>
                        <th className="py-1 pr-2 text-right">Estimate</th>
                        <th className="py-1 pr-2 text-right"><i>u</i>(<i>x</i><sub>i</sub>)</th>
                        <th className="py-1 pr-2">Distribution</th>
                        <th className="py-1 pr-2 text-right"><i>c</i><sub>i</sub></th>
                        <th className="py-1 pr-2 text-right">|<i>c</i><sub>i</sub>| <i>u</i>(<i>x</i><sub>i</sub>) / {formatUnit(r.unit)}</th>
                        <th className="py-1 pr-2 text-right">Share</th>
                      </tr>
                    </thead>
                    <tbody>
                      {r.gum.budget.map((b) => {
                        // In the unit the analyst saw for the input (°C, µm), as the budget editor shows it.
                        const input = p.inputs.find((i) => i.symbol === b.symbol);
                        const d = inDisplayUnit(b, input?.unit ?? '', input?.displayUnit);
                        return (
                        <tr key={b.symbol} className="border-b border-line">
                          <td className="py-1 pr-2">
                            {/* Typeset as in the certificate's annex (ε_bb, λ_eff, δT_res); the model's identifier is the tooltip. */}
                            <Sym name={b.symbol} />
                          </td>
                          <td className="whitespace-nowrap py-1 pr-2 text-right font-mono tabular-nums">{sig(d.estimate)} <UnitSlot>{d.unit}</UnitSlot></td>
                          <td className="whitespace-nowrap py-1 pr-2 text-right font-mono tabular-nums">{sig(d.u)} <UnitSlot>{d.unit}</UnitSlot></td>
                          <td className="py-1 pr-2">{distributionLabel(b.distribution)}</td>
                          <td className="whitespace-nowrap py-1 pr-2 text-right font-mono tabular-nums">{sig(d.c)} <UnitSlot wide>{sensitivityUnit(r.unit, d.unit)}</UnitSlot></td>
                          <td className="py-1 pr-2 text-right font-mono tabular-nums">{sig(b.contribution)}</td>
                          <td className="py-1 pr-2 text-right font-mono tabular-nums">{formatNumber(b.share * 100, { decimals: 1, notation: 'fixed' })} %</td>
                        </tr>
                        );
                      })}
                    </tbody>
                  </table>
                </>
              )}
            </div>
          );
        })}
      </section>
      <section aria-labelledby="preview-heading" className="space-y-2">
        <h2 id="preview-heading" className="text-xl font-semibold">What the certificate will say</h2>
        {d.preview ? <CertificatePreview data={d.preview} /> : <p className="text-ink-muted">The certificate cannot be assembled yet: see the points above.</p>}
      </section>
      {open && !issued && !rejected && (
        <div className="grid gap-4 md:grid-cols-2">
          <ApproveForm jobId={d.job.id} jobNumber={d.job.number} disabled={d.blocking.length > 0} onIssued={setIssued} />
          <RejectForm jobId={d.job.id} disabled={false} onRejected={() => setRejected(true)} />
        </div>
      )}
    </div>
  );
}
