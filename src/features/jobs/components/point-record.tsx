/**
 * One calibration point of a closed job (approved or issued) as a record: its input quantities as
 * text (value, unit, distribution and its parameters, in the unit the analyst chose and printed as
 * the budget rows print figures: shared/format), its correlations, the GUM budget, the stored
 * result and its charts. Nothing here is a form: the job can no longer change, and a new
 * certificate comes from an amendment (ISO/IEC 17025:2017 §7.8.8). A draft or submitted job has
 * the budget editor instead (src/features/budgets).
 */
import { Fragment, useMemo, type ReactNode } from 'react';
import { evaluateGum, EngineError, typeA, type EvaluationResult } from '../../../../shared/engine';
import { formatNumber } from '../../../../shared/format/number';
import { formatUnit, printedUnit } from '../../../../shared/format/units';
import { pointBudget } from '../../../../shared/jobs/point-budget';
import type { Distribution } from '../../../../shared/schemas/budget.schema';
import type { PointInput } from '../../../../shared/schemas/jobs.schema';
import type { TemplateDefinition } from '../../../../shared/schemas/template.schema';
import { INPUT_SOURCE_LABELS } from '../../../../shared/schemas/template.schema';
import { BudgetTable } from '../../budgets/components/budget-table';
import { InputsTableHead } from '../../budgets/components/input-row';
import { StoredResultSection } from '../../budgets/components/stored-result';
import { DISTRIBUTION_LABELS, parameterKeys, POSITION_KEYS, toDisplay, WIDTH_KEYS } from '../../budgets/components/units';
import { Sym } from '../../templates/components/math-tex';
import type { Point, Standard } from '../api/types';

/** A figure with its unit, kept on one line with it (no-break space); no unit for a pure number. */
function withUnit(x: number, unit: string): string {
  return unit ? `${formatNumber(x)}\u00a0${unit}` : formatNumber(x);
}

/**
 * A parameter's name as the editor labels its field, typeset: a quantity symbol (u, U, k, a, β,
 * ν, d) in italics, a word (mean, centre, min …) upright (ISO 80000-1 §7.1).
 */
function ParameterName({ label }: { label: string }) {
  const words = label.split(' ');
  const last = words.pop()!;
  const symbol = [...last].length === 1;
  return (
    <span className="font-sans text-ink-muted">
      {words.length > 0 && `${words.join(' ')} `}
      {symbol ? <i>{last}</i> : last}
    </span>
  );
}

/** The distribution's parameters as text, "mean = 80 °C, U = 0.06 °C, k = 2", in the shown unit. */
function Parameters({ d, si, shown }: { d: Distribution; si: string | undefined; shown: string | undefined }) {
  const unit = printedUnit(shown ?? si ?? '');
  const keys = parameterKeys(d);
  if (keys.length === 0) return null;
  return (
    <span className="font-mono tabular-nums">
      {keys.map(({ key, label }, i) => {
        const value = toDisplay(key, (d as unknown as Record<string, number>)[key] ?? 0, si, shown);
        // Positions and widths are in the input's unit; k, β, ν and a gamma shape are numbers.
        const hasUnit = POSITION_KEYS.has(key) || WIDTH_KEYS.has(key);
        return (
          <Fragment key={key}>
            {i > 0 && ', '}
            <span className="whitespace-nowrap" data-parameter={key}>
              <ParameterName label={label} /> = {withUnit(value, hasUnit ? unit : '')}
            </span>
          </Fragment>
        );
      })}
    </span>
  );
}

/** Repeated readings summarised as the editor does (GUM 4.2: n, mean, s, s/√n, ν = n − 1). */
function readingsSummary(d: Distribution, si: string | undefined, shown: string | undefined): string | null {
  if (d.type !== 'readings' || d.values.length < 2) return null;
  const a = typeA(d.values.map((v) => toDisplay('mean', v, si, shown)));
  const unit = printedUnit(shown ?? si ?? '');
  const f = (x: number) => `${formatNumber(x, { digits: 5 })}${unit ? `\u00a0${unit}` : ''}`;
  return `n = ${a.n}, mean = ${f(a.mean)}, s = ${f(a.s)}, s/√n = ${f(a.u)}, ν = ${a.dof}`;
}

/**
 * Where a value taken from a reference standard came from: the standard and its certificate, and
 * the note kept when the value was taken (which names them already when the editor wrote it).
 */
function standardText(input: PointInput, standards: Standard[]): string | null {
  const note = input.standardNote || null;
  const s = input.standardId ? standards.find((x) => x.id === input.standardId) : undefined;
  if (!s) return note;
  const standard = `${s.name}${s.certificateNumber ? `, certificate ${s.certificateNumber}` : ''}`;
  if (!note) return standard;
  return note.startsWith(s.name) ? note : `${standard}: ${note}`;
}

function InputRecordRow({ input, shown, standards }: { input: PointInput; shown: string | undefined; standards: Standard[] }) {
  const d = input.distribution;
  const si = input.unit;
  const readings = d ? readingsSummary(d, si, shown) : null;
  const standard = standardText(input, standards);
  return (
    <tr className="border-b border-line align-top" data-input={input.symbol}>
      <td className="py-1.5 pr-2">
        <Sym name={input.symbol} />
        <p className="max-w-64 text-xs text-ink-muted">{input.description}</p>
        {input.source && <p className="text-xs text-ink-muted">from: {INPUT_SOURCE_LABELS[input.source]}</p>}
      </td>
      <td className="py-1.5 pr-2">{formatUnit(shown ?? si ?? '') || '1'}</td>
      <td className="py-1.5 pr-2">{d ? DISTRIBUTION_LABELS[d.type] : <span className="font-semibold text-danger">✕ not filled</span>}</td>
      <td className="py-1.5">
        {d && <Parameters d={d} si={si} shown={shown} />}
        {readings && <span className="font-mono tabular-nums" data-testid={`typea-${input.symbol}`}>{readings}</span>}
        {standard && <p className="mt-0.5 text-xs text-ink-muted">{standard}</p>}
      </td>
    </tr>
  );
}

/**
 * The point of a closed job: inputs and correlations as text, then the budget, the stored result
 * and the charts as the budget editor shows them. `standards`: the reference standards the job's
 * points took values from.
 */
export function PointRecord({ point, definition, standards }: { point: Point; definition: TemplateDefinition; standards: Standard[] }) {
  // Each input in the unit the analyst chose for it, as the editor opened it; SI inside.
  const units = useMemo(() => Object.fromEntries(point.inputs.map((i) => [i.symbol, i.displayUnit ?? i.unit])), [point.inputs]);
  // The stored result is the record (the certificate was issued from it): its budget is shown as
  // stored, whatever engine version reads the page later. Recomputed only for a point without one.
  const budget = useMemo((): { result: EvaluationResult | null; error: ReactNode } => {
    if (point.result) return { result: point.result, error: null };
    const doc = pointBudget(definition, { inputs: point.inputs, correlations: point.correlations });
    if (!doc) return { result: null, error: 'Not every input has a value, so there is no budget.' };
    try {
      return { result: evaluateGum(doc, { codegen: false }), error: null };
    } catch (err) {
      return { result: null, error: err instanceof EngineError ? err.message : String(err) };
    }
  }, [definition, point.result, point.inputs, point.correlations]);

  return (
    <div className="flex flex-col gap-5">
      <section aria-labelledby="inputs-heading" className="overflow-x-auto rounded-card border border-line bg-surface p-4">
        <h3 id="inputs-heading" className="mb-2 text-base font-semibold">Input quantities</h3>
        <p className="mb-2 text-xs text-ink-muted">Each value in the unit given beside it; the calculation itself is in SI.</p>
        <table className="w-full border-collapse text-sm">
          <InputsTableHead />
          <tbody>
            {point.inputs.map((input) => (
              <InputRecordRow key={input.symbol} input={input} shown={units[input.symbol]} standards={standards} />
            ))}
          </tbody>
        </table>
        <p className="mt-3 text-sm" data-testid="correlations">
          {point.correlations.length === 0 ? (
            <span className="text-ink-muted">No correlation between the inputs.</span>
          ) : (
            <>
              Correlation coefficients (JCGM 101 §6.4.8):{' '}
              {point.correlations.map((c, i) => (
                <Fragment key={c.between.join('-')}>
                  {i > 0 && '; '}
                  <span className="whitespace-nowrap">
                    <i>r</i>(<Sym name={c.between[0]} />, <Sym name={c.between[1]} />) = <span className="font-mono tabular-nums">{formatNumber(c.r)}</span>
                  </span>
                </Fragment>
              ))}
            </>
          )}
        </p>
      </section>

      <section aria-labelledby="budget-heading" className="overflow-x-auto rounded-card border border-line bg-surface p-4">
        <h3 id="budget-heading" className="mb-2 text-base font-semibold">Budget (GUM)</h3>
        <p className="mb-2 text-xs text-ink-muted">Estimates, u(x<sub>i</sub>) and c<sub>i</sub> in the unit chosen for each input above; the calculation itself is in SI.</p>
        {budget.result ? <BudgetTable result={budget.result} inputs={point.inputs} shownUnits={units} /> : <p className="text-sm text-ink-muted">{budget.error}</p>}
        {budget.result?.warnings.map((w) => (
          <p key={w} className="mt-2 text-xs text-warn">⚠ {w}</p>
        ))}
      </section>

      <StoredResultSection point={point} definition={definition} />
    </div>
  );
}
