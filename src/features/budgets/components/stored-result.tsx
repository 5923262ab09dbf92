/**
 * A point's stored result (computed on the server when the analyst asked): the reported value and
 * U, the GUM and Monte Carlo coverage intervals, the JCGM 101 §8 validation, whether the budget
 * changed since, and the charts (histogram, contributions, Planck curve). Shown by the budget
 * editor of an open job and by the record of a closed one (src/features/jobs, PointRecord).
 */
import { formatDateTimeUtc } from '../../../../shared/format/date';
import { formatNumber } from '../../../../shared/format/number';
import { roundUncertainty } from '../../../../shared/format/result';
import { formatUnit } from '../../../../shared/format/units';
import type { TemplateDefinition } from '../../../../shared/schemas/template.schema';
import type { Point } from '../../jobs/api/types';
import { Sym } from '../../templates/components/math-tex';
import { ContributionsChart, HistogramChart, PlanckChart } from './charts';

/**
 * Figures rounded to the decimal place of an uncertainty's second significant digit (GUM 7.2.6;
 * JCGM 101:2008 §7.9), as the value beside it is; four significant digits where a power of ten
 * would be needed.
 */
function atPlaceOf(uncertainty: number) {
  const { lastDigitExponent: e } = roundUncertainty(uncertainty);
  return (x: number) => {
    const m = Math.max(Math.abs(x), uncertainty);
    if (!(uncertainty > 0) || m >= 1e6 || m < 1e-3) return formatNumber(x, { digits: 4 });
    const xr = e > 0 ? Math.round(x / 10 ** e) * 10 ** e : x;
    return formatNumber(xr, { decimals: Math.max(0, -e), notation: 'fixed' });
  };
}

function StoredResultText({ point }: { point: Point }) {
  const r = point.result!;
  const rep = point.reported!;
  const unit = formatUnit(r.unit);
  // The intervals at the decimal place of their U, not 4 significant digits beside a U of two.
  const g = atPlaceOf(r.gum.U);
  const m = r.mcm ? atPlaceOf(r.mcm.u) : g;
  const mi = r.mcm ? atPlaceOf((r.mcm.interval[1] - r.mcm.interval[0]) / 2) : g;
  return (
    <div className="mt-1 text-sm">
      <p className="font-mono tabular-nums">
        <Sym name={r.measurand} className="font-sans" /> = {r.reported.value} {unit}, U = {r.reported.U} {unit} (k = {r.reported.k}) · GUM interval [{g(r.gum.interval[0])}, {g(r.gum.interval[1])}] {unit}
      </p>
      {r.mcm && (
        <p className="font-mono tabular-nums">
          Monte Carlo: y = {m(r.mcm.y)} {unit}, u = {m(r.mcm.u)} {unit}, {r.mcm.intervalKind} interval [{mi(r.mcm.interval[0])}, {mi(r.mcm.interval[1])}] {unit}
        </p>
      )}
      {r.validation ? (
        <p className={r.validation.passed ? 'text-ok' : 'font-semibold text-warn'}>
          {r.validation.passed ? '✓ GUM validated by Monte Carlo' : '⚠ GUM not validated by Monte Carlo'} (JCGM 101 §8: <i>d</i><sub>low</sub> = {r.validation.dLow.toPrecision(2)}, <i>d</i><sub>high</sub> = {r.validation.dHigh.toPrecision(2)}, <i>δ</i> = {r.validation.delta.toPrecision(2)})
        </p>
      ) : (
        <p className="text-ink-muted">No Monte Carlo run for this result yet.</p>
      )}
      {rep.note && <p className="font-semibold text-warn">{rep.note}</p>}
      <p className="text-xs text-ink-muted">
        {point.current ? 'Current' : '✕ Not current: the budget changed after this result'} · {point.resultEngineVersion}
        {point.resultSeed !== null ? ` · seed ${point.resultSeed}` : ''} · computed {formatDateTimeUtc(point.computedAt, { seconds: true })}
      </p>
    </div>
  );
}

/** The stored result section, or nothing when the point has no stored result. */
export function StoredResultSection({ point, definition }: { point: Point; definition: TemplateDefinition }) {
  const stored = point.result;
  if (!stored) return null;
  const T = stored.gum.budget.find((b) => b.symbol === 'T_bb' || b.symbol === 'T_ref' || b.symbol === 'T')?.estimate;
  const lambda = stored.gum.budget.find((b) => b.symbol.startsWith('lambda'))?.estimate;
  const radiometric = definition.equations.some((e) => /planck|sh_signal|its90_ratio|band_radiance/.test(e));
  return (
    <section aria-labelledby="stored-heading" className="rounded-card border border-line bg-surface p-4">
      <h3 id="stored-heading" className="text-base font-semibold">Stored result</h3>
      <StoredResultText point={point} />
      {stored.mcm && <HistogramChart result={stored} />}
      <div className="mt-4 grid gap-4 lg:grid-cols-2">
        <div>
          <h4 className="text-sm font-semibold">Contributions, largest first</h4>
          <ContributionsChart result={stored} />
        </div>
        {radiometric && T && lambda && (
          <div>
            <h4 className="text-sm font-semibold">Planck curve at the point</h4>
            <PlanckChart T={T} lambda={lambda} />
          </div>
        )}
      </div>
    </section>
  );
}
