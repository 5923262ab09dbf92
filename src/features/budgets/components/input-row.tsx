import { useState, type KeyboardEvent } from 'react';
import { typeA } from '../../../../shared/engine';
import { formatNumber } from '../../../../shared/format/number';
import { formatUnit, printedUnit } from '../../../../shared/format/units';
import { DISTRIBUTION_TYPES, type Distribution } from '../../../../shared/schemas/budget.schema';
import type { PointInput } from '../../../../shared/schemas/jobs.schema';
import { INPUT_SOURCE_LABELS } from '../../../../shared/schemas/template.schema';
import type { Standard } from '../../jobs/api/types';
import { Sym } from '../../templates/components/math-tex';
import { DISTRIBUTION_LABELS, fromDisplay, parameterKeys, switchType, toDisplay, unitChoices } from './units';

/** Enter moves to the same column of the next row, Shift+Enter back (Tab moves along the row). */
export function gridKeys(e: KeyboardEvent<HTMLElement>) {
  if (e.key !== 'Enter') return;
  const el = e.currentTarget;
  const row = Number(el.dataset.row);
  const col = el.dataset.col;
  const next = document.querySelector<HTMLElement>(`[data-grid="budget"][data-row="${row + (e.shiftKey ? -1 : 1)}"][data-col="${col}"]`) ?? document.querySelector<HTMLElement>(`[data-grid="budget"][data-row="${row + (e.shiftKey ? -1 : 1)}"]`);
  if (next) {
    e.preventDefault();
    next.focus();
    if (next instanceof HTMLInputElement) next.select();
  }
}

function NumberCell({ value, onChange, label, row, col, disabled }: { value: number; onChange: (v: number) => void; label: string; row: number; col: string; disabled?: boolean }) {
  const [text, setText] = useState<string | null>(null);
  const shown = text ?? String(Number(value.toPrecision(12)));
  const bad = text !== null && (text.trim() === '' || !Number.isFinite(Number(text)));
  return (
    <span className="inline-flex flex-col">
      <input
        aria-label={label}
        data-grid="budget"
        data-row={row}
        data-col={col}
        inputMode="decimal"
        disabled={disabled}
        className={`w-28 rounded-field border bg-surface px-1.5 py-0.5 text-right font-mono text-sm tabular-nums ${bad ? 'border-danger' : 'border-line-strong'}`}
        value={shown}
        aria-invalid={bad || undefined}
        onChange={(e) => {
          const t = e.target.value;
          setText(t);
          const v = Number(t.replace(',', '.').replace('−', '-'));
          if (t.trim() !== '' && Number.isFinite(v)) onChange(v);
        }}
        onBlur={() => setText(null)}
        onKeyDown={gridKeys}
      />
      {bad && <span className="text-xs text-danger">✕ a number, please</span>}
    </span>
  );
}

/** Column headings of an input table: the budget editor's rows (InputRow) and a closed job's record. */
export function InputsTableHead() {
  return (
    <thead>
      <tr className="border-b border-line-strong text-left text-xs text-ink-muted">
        <th className="py-1.5 pr-2 font-semibold">Symbol and meaning</th>
        <th className="py-1.5 pr-2 font-semibold">Unit</th>
        <th className="py-1.5 pr-2 font-semibold">Distribution</th>
        <th className="py-1.5 font-semibold">Value and parameters</th>
      </tr>
    </thead>
  );
}

export function InputRow(props: {
  input: PointInput;
  row: number;
  shownUnit: string | undefined;
  onUnit: (u: string) => void;
  onChange: (next: PointInput) => void;
  onReadings: () => void;
  onStandard: () => void;
  standard: Standard | null;
  today: string;
  reasons: string[];
  disabled?: boolean;
  /** The job is closed: the readings and standard pickers are left out, not only disabled. */
  closed?: boolean;
}) {
  const { input, row, shownUnit, onChange, disabled } = props;
  const d = input.distribution;
  const si = input.unit;
  const choices = unitChoices(si);
  const setParam = (key: string, v: number) => {
    if (!d) return;
    onChange({ ...input, distribution: { ...d, [key]: fromDisplay(key, v, si, shownUnit) } as Distribution });
  };
  const overdue = props.standard?.dueDate ? props.standard.dueDate < props.today : false;
  let readingsSummary: string | null = null;
  if (d?.type === 'readings' && d.values.length >= 2) {
    const shownValues = d.values.map((v) => toDisplay('mean', v, si, shownUnit));
    const a = typeA(shownValues);
    // Each figure with its unit, kept on one line with it (no-break space).
    const unit = printedUnit(shownUnit ?? si ?? '');
    const f = (x: number) => `${formatNumber(x, { digits: 5 })}${unit ? `\u00a0${unit}` : ''}`;
    readingsSummary = `n = ${a.n}, mean = ${f(a.mean)}, s = ${f(a.s)}, s/√n = ${f(a.u)}, ν = ${a.dof}`;
  }
  return (
    <tr className="border-b border-line align-top" data-input={input.symbol}>
      <td className="py-1.5 pr-2">
        {/* Typeset as the review page and the certificate show it; the model identifier in the tooltip. */}
        <Sym name={input.symbol} />
        <p className="max-w-64 text-xs text-ink-muted">{input.description}</p>
        {input.source && <p className="text-xs text-ink-muted">from: {INPUT_SOURCE_LABELS[input.source]}</p>}
      </td>
      <td className="py-1.5 pr-2">
        {choices.length > 1 ? (
          <select aria-label={`unit of ${input.symbol}`} className="rounded-field border border-line-strong bg-surface px-1 py-0.5 text-sm" value={formatUnit(shownUnit ?? si ?? '')} onChange={(e) => props.onUnit(e.target.value)}>
            {choices.map((u) => (
              <option key={u} value={u}>{u}</option>
            ))}
          </select>
        ) : (
          <span className="text-sm">{formatUnit(si ?? '') || '1'}</span>
        )}
      </td>
      <td className="py-1.5 pr-2">
        {d === null ? (
          <span className="text-sm font-semibold text-danger">✕ not filled</span>
        ) : (
          <select
            aria-label={`distribution of ${input.symbol}`}
            data-grid="budget"
            data-row={row}
            data-col="dist"
            disabled={disabled || input.source === 'readings'}
            className="rounded-field border border-line-strong bg-surface px-1 py-0.5 text-sm"
            value={d.type}
            onKeyDown={gridKeys}
            onChange={(e) => {
              const type = e.target.value as Distribution['type'];
              const est = 'mean' in d ? (d as { mean: number }).mean : 'value' in d ? d.value : 'min' in d ? ((d as { min: number; max: number }).min + (d as { max: number }).max) / 2 : 0;
              onChange({ ...input, distribution: switchType(type, est, 0) });
            }}
          >
            {DISTRIBUTION_TYPES.filter((t) => t !== 'readings' || d.type === 'readings').map((t) => (
              <option key={t} value={t}>{DISTRIBUTION_LABELS[t]}</option>
            ))}
          </select>
        )}
      </td>
      <td className="py-1.5 pr-2">
        <div className="flex flex-wrap items-start gap-x-3 gap-y-1">
          {d &&
            parameterKeys(d).map(({ key, label }, i) => (
              <label key={key} className="flex items-center gap-1 text-xs text-ink-muted">
                <span className="italic">{label}</span>
                <NumberCell
                  label={`${label} of ${input.symbol}`}
                  value={toDisplay(key, (d as unknown as Record<string, number>)[key] ?? 0, si, shownUnit)}
                  onChange={(v) => setParam(key, v)}
                  row={row}
                  col={`p${i}`}
                  disabled={disabled}
                />
              </label>
            ))}
          {readingsSummary && <span className="font-mono text-xs tabular-nums" data-testid={`typea-${input.symbol}`}>{readingsSummary}</span>}
          {!props.closed && (input.source === 'readings' || d?.type === 'readings') && (
            <button type="button" className="text-xs font-semibold text-ember-strong underline" onClick={props.onReadings} disabled={disabled}>
              {d ? 'Change readings' : 'Enter or upload readings'}
            </button>
          )}
          {!props.closed && input.source === 'reference' && (
            <button type="button" className="text-xs font-semibold text-ember-strong underline" onClick={props.onStandard} disabled={disabled}>
              {props.standard ? 'Other standard' : 'Take from a reference standard'}
            </button>
          )}
        </div>
        {props.standard && (
          <p className={`mt-1 text-xs ${overdue ? 'font-semibold text-danger' : 'text-ink-muted'}`}>
            {props.standard.name}
            {props.standard.certificateNumber ? `, certificate ${props.standard.certificateNumber}` : ''} · due {props.standard.dueDate ?? '—'}
            {overdue ? ' · ✕ overdue: it may not be used' : ''}
          </p>
        )}
        {props.reasons.map((r) => (
          <p key={r} className="mt-1 text-xs font-medium text-danger" role="note">
            ✕ {r}
          </p>
        ))}
      </td>
    </tr>
  );
}
