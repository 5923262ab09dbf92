/**
 * The budget editor of one calibration point: input rows (value and distribution in people's
 * units, SI inside), readings, reference-standard values, correlations, and the GUM budget
 * table recomputed in the browser as the analyst types (debounced). Monte Carlo runs on the server.
 */
import { Fragment, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { evaluateGum, EngineError, type EvaluationResult } from '../../../../shared/engine';
import { formatNumber } from '../../../../shared/format/number';
import { formatUnit } from '../../../../shared/format/units';
import { pointBudget } from '../../../../shared/jobs/point-budget';
import type { PointInput } from '../../../../shared/schemas/jobs.schema';
import type { TemplateDefinition } from '../../../../shared/schemas/template.schema';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { calculatePoint, fromStandard, savePoint, typedReadings, uploadReadings } from '../../jobs/api/points';
import type { Point, Reason, Standard } from '../../jobs/api/types';
import { BudgetTable } from './budget-table';
import { InputRow, InputsTableHead } from './input-row';
import { MonteCarloPanel } from './monte-carlo-panel';
import { StoredResultSection } from './stored-result';
import { useDebounced } from '../../../lib/use-debounced';
import { Sym } from '../../templates/components/math-tex';
import { symbolPlain } from '../../templates/components/symbol-tex';

type Correlation = { between: [string, string]; r: number };

/** Symbols typeset in running text: "a, b and c". */
function SymList({ names }: { names: string[] }) {
  return (
    <>
      {names.map((n, i) => (
        <Fragment key={n}>
          {i > 0 && (i === names.length - 1 ? ' and ' : ', ')}
          <Sym name={n} />
        </Fragment>
      ))}
    </>
  );
}

/**
 * `editable`: the signed-in analyst may change this point now (fields and buttons enabled).
 * `closed`: the job can never be changed again (approved or issued): the editing buttons, the
 * readings and standard pickers, the correlation controls and the Monte Carlo panel are left
 * out, and the point reads as a record (values, budget, stored result, charts).
 */
export function BudgetEditor({ point, definition, standards, reasons, today, editable, closed = false, onSaved }: {
  point: Point;
  definition: TemplateDefinition;
  standards: Standard[];
  reasons: Reason[];
  today: string;
  editable: boolean;
  closed?: boolean;
  onSaved: () => Promise<unknown>;
}) {
  const [inputs, setInputs] = useState<PointInput[]>(point.inputs);
  const [correlations, setCorrelations] = useState<Correlation[]>(point.correlations);
  const [units, setUnits] = useState<Record<string, string | undefined>>(() => Object.fromEntries(point.inputs.map((i) => [i.symbol, i.displayUnit ?? i.unit])));
  const [dirty, setDirty] = useState(false);
  const [panel, setPanel] = useState<{ kind: 'readings' | 'standard'; symbol: string } | null>(null);
  const [status, setStatus] = useState<{ tone: 'ok' | 'danger' | 'info'; text: ReactNode } | null>(null);
  const [busy, setBusy] = useState(false);
  const lastServer = useRef(point.changedAt);

  // A newer server copy (after a save, an upload, a run) replaces the local one when nothing is pending.
  useEffect(() => {
    if (point.changedAt !== lastServer.current && !dirty) {
      setInputs(point.inputs);
      setCorrelations(point.correlations);
    }
    lastServer.current = point.changedAt;
  }, [point, dirty]);

  const debouncedInputs = useDebounced(inputs, 200);
  const debouncedCorr = useDebounced(correlations, 200);
  const live = useMemo((): { result: EvaluationResult | null; error: ReactNode } => {
    const doc = pointBudget(definition, { inputs: debouncedInputs, correlations: debouncedCorr });
    if (!doc) return { result: null, error: <>Fill <SymList names={debouncedInputs.filter((i) => i.distribution === null).map((i) => i.symbol)} /> to see the budget.</> };
    try {
      return { result: evaluateGum(doc, { codegen: false }), error: null };
    } catch (err) {
      return { result: null, error: err instanceof EngineError ? err.message : String(err) };
    }
  }, [definition, debouncedInputs, debouncedCorr]);

  const change = (next: PointInput) => {
    setInputs((all) => all.map((i) => (i.symbol === next.symbol ? next : i)));
    setDirty(true);
  };

  async function save(): Promise<void> {
    if (!dirty) return;
    await savePoint(point.id, { inputs, correlations });
    setDirty(false);
  }

  async function act(what: () => Promise<unknown>, ok: ReactNode) {
    setBusy(true);
    setStatus(null);
    try {
      await what();
      await onSaved();
      setStatus({ tone: 'ok', text: ok });
    } catch (err) {
      setStatus({ tone: 'danger', text: err instanceof ApiError ? err.message : String(err) });
    } finally {
      setBusy(false);
    }
  }

  const byStandard = new Map(standards.map((s) => [s.id, s]));
  const reasonsFor = (symbol: string | null) => reasons.filter((r) => r.pointId === point.id && r.symbol === symbol).map((r) => r.message.replace(/^Point \d+: /, ''));

  return (
    <div className="flex flex-col gap-5">
      <section aria-labelledby="inputs-heading" className="overflow-x-auto rounded-card border border-line bg-surface p-4">
        <div className="mb-2 flex flex-wrap items-center gap-3">
          <h3 id="inputs-heading" className="mr-auto text-base font-semibold">Input quantities</h3>
          {!closed && (
            <>
              {dirty && <span className="text-xs font-semibold text-warn">Unsaved changes</span>}
              <Button variant="secondary" disabled={!editable || busy || !dirty} onClick={() => void act(save, 'Budget saved.')}>Save budget</Button>
              <Button disabled={!editable || busy || !live.result} onClick={() => void act(async () => { await save(); await calculatePoint(point.id); }, 'Saved and calculated (GUM). Run Monte Carlo to validate it.')}>Save and calculate</Button>
            </>
          )}
        </div>
        <p className="mb-2 text-xs text-ink-muted">{closed ? '' : 'Tab moves along a row, Enter to the same field of the next row. '}Values are shown in the unit chosen at the left of each row and kept in SI.</p>
        <table className="w-full border-collapse text-sm">
          <InputsTableHead />
          <tbody>
            {inputs.map((input, row) => (
              <InputRow
                key={input.symbol}
                input={input}
                row={row}
                shownUnit={units[input.symbol]}
                onUnit={(u) => setUnits((m) => ({ ...m, [input.symbol]: u }))}
                onChange={change}
                onReadings={() => setPanel({ kind: 'readings', symbol: input.symbol })}
                onStandard={() => setPanel({ kind: 'standard', symbol: input.symbol })}
                standard={input.standardId ? (byStandard.get(input.standardId) ?? null) : null}
                today={today}
                reasons={reasonsFor(input.symbol)}
                disabled={!editable}
                closed={closed}
              />
            ))}
          </tbody>
        </table>
        {panel?.kind === 'readings' && (
          <ReadingsPanel
            symbol={panel.symbol}
            unit={units[panel.symbol]}
            onClose={() => setPanel(null)}
            onText={(text) => act(async () => { await save(); await typedReadings(point.id, panel.symbol, { text, unit: units[panel.symbol] }); setPanel(null); }, <>Readings of <Sym name={panel.symbol} /> saved.</>)}
            onFile={(file, column) => act(async () => { await save(); const r = await uploadReadings(point.id, panel.symbol, file, { column, unit: units[panel.symbol] }); setPanel(null); return r; }, <>Readings of <Sym name={panel.symbol} /> read from the file and saved.</>)}
            busy={busy}
          />
        )}
        {panel?.kind === 'standard' && (
          <StandardPicker
            symbol={panel.symbol}
            standards={standards}
            today={today}
            onClose={() => setPanel(null)}
            onPick={(standardId, valueIndex) => act(async () => { await save(); await fromStandard(point.id, panel.symbol, { standardId, valueIndex }); setPanel(null); }, <><Sym name={panel.symbol} /> taken from the standard’s certificate (<i>u</i> = <i>U</i>/<i>k</i>).</>)}
          />
        )}
        <CorrelationEditor inputs={inputs} correlations={correlations} disabled={!editable} closed={closed} onChange={(c) => { setCorrelations(c); setDirty(true); }} />
        {status && <Notice className="mt-3" tone={status.tone} label={status.tone === 'ok' ? 'Saved' : status.tone === 'danger' ? 'Not saved' : 'Note'} role="status">{status.text}</Notice>}
      </section>

      <section aria-labelledby="budget-heading" className="overflow-x-auto rounded-card border border-line bg-surface p-4">
        <h3 id="budget-heading" className="mb-2 text-base font-semibold">{closed ? 'Budget (GUM)' : 'Budget (GUM, computed as you type)'}</h3>
        <p className="mb-2 text-xs text-ink-muted">Estimates, u(x<sub>i</sub>) and c<sub>i</sub> in the unit chosen for each input above; the calculation itself is in SI.</p>
        {live.result ? <BudgetTable result={live.result} inputs={inputs} shownUnits={units} /> : <p className="text-sm text-ink-muted">{live.error}</p>}
        {live.result?.warnings.map((w) => (
          <p key={w} className="mt-2 text-xs text-warn">⚠ {w}</p>
        ))}
        {reasonsFor(null).map((r) => (
          <p key={r} className="mt-2 text-xs font-medium text-danger" role="note">✕ {r}</p>
        ))}
      </section>

      {!closed && <MonteCarloPanel pointId={point.id} defaultTrials={definition.monteCarlo?.trials ?? 1_000_000} disabled={!editable || busy || !live.result} beforeRun={save} onDone={() => void onSaved()} />}

      <StoredResultSection point={point} definition={definition} />
    </div>
  );
}

function ReadingsPanel({ symbol, unit, onClose, onText, onFile, busy }: { symbol: string; unit: string | undefined; onClose: () => void; onText: (t: string) => void; onFile: (f: File, column?: string) => void; busy: boolean }) {
  const [text, setText] = useState('');
  const [column, setColumn] = useState('');
  const fileRef = useRef<HTMLInputElement>(null);
  return (
    <div className="mt-3 rounded-card border border-line-strong bg-sunken p-3" role="group" aria-label={`Readings of ${symbol}`}>
      <div className="flex items-center gap-2">
        <h4 className="mr-auto text-sm font-semibold">Readings of <Sym name={symbol} className="font-normal" />, in {formatUnit(unit ?? '')}</h4>
        <Button variant="quiet" onClick={onClose}>Close</Button>
      </div>
      <div className="mt-2 grid gap-3 md:grid-cols-2">
        <label className="flex flex-col gap-1 text-sm">
          Type or paste (one value per line, or a column copied from a spreadsheet)
          <textarea className="h-28 rounded-field border border-line-strong bg-surface p-2 font-mono text-sm" value={text} onChange={(e) => setText(e.target.value)} />
          <Button variant="secondary" disabled={busy || text.trim() === ''} onClick={() => onText(text)}>Use these readings</Button>
        </label>
        <div className="flex flex-col gap-2 text-sm">
          <label className="flex flex-col gap-1">
            Upload a CSV or XLSX file (one column of numbers, header optional; at most 2 MB)
            <input ref={fileRef} type="file" accept=".csv,.txt,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet" aria-label="Readings file" className="text-sm" />
          </label>
          <label className="flex flex-col gap-1">
            Column (name or letter; needed when the file has several)
            <input className="rounded-field border border-line-strong bg-surface px-2 py-1" value={column} onChange={(e) => setColumn(e.target.value)} />
          </label>
          <Button variant="secondary" disabled={busy} onClick={() => { const f = fileRef.current?.files?.[0]; if (f) onFile(f, column || undefined); }}>Upload readings</Button>
        </div>
      </div>
    </div>
  );
}

function StandardPicker({ symbol, standards, today, onClose, onPick }: { symbol: string; standards: Standard[]; today: string; onClose: () => void; onPick: (id: string, valueIndex: number) => void }) {
  return (
    <div className="mt-3 rounded-card border border-line-strong bg-sunken p-3" role="group" aria-label={`Reference standard for ${symbol}`}>
      <div className="flex items-center gap-2">
        <h4 className="mr-auto text-sm font-semibold">Take <Sym name={symbol} className="font-normal" /> from a reference standard’s certificate</h4>
        <Button variant="quiet" onClick={onClose}>Close</Button>
      </div>
      {standards.length === 0 && <p className="text-sm text-ink-muted">The register has no reference standards yet: ask the quality manager to add them.</p>}
      <ul className="mt-2 flex flex-col gap-1">
        {standards.flatMap((s) =>
          s.values.map((v, i) => {
            const overdue = s.dueDate !== null && s.dueDate < today;
            return (
              <li key={`${s.id}-${i}`} className="flex flex-wrap items-center gap-3 border-b border-line py-1 text-sm">
                <span className="min-w-56 font-semibold">{s.name}</span>
                <span className="font-mono tabular-nums">{v.label}: {formatNumber(v.value, { digits: 7 })} {formatUnit(v.unit)}, U = {formatNumber(v.U, { digits: 3 })} (k = {v.k}) → u = {formatNumber(v.U / v.k, { digits: 3 })}</span>
                <span className={overdue ? 'font-semibold text-danger' : 'text-ink-muted'}>due {s.dueDate}{overdue ? ' · ✕ overdue' : ''}</span>
                <Button variant="secondary" className="ml-auto px-2 py-0.5" onClick={() => onPick(s.id, i)}>Use</Button>
              </li>
            );
          }),
        )}
      </ul>
    </div>
  );
}

function CorrelationEditor({ inputs, correlations, onChange, disabled, closed }: { inputs: PointInput[]; correlations: Correlation[]; onChange: (c: Correlation[]) => void; disabled?: boolean; closed: boolean }) {
  const normals = inputs.filter((i) => i.distribution?.type === 'normal').map((i) => i.symbol);
  const [a, setA] = useState('');
  const [b, setB] = useState('');
  return (
    <details className="mt-3">
      <summary className="cursor-pointer text-sm font-semibold">Correlations ({correlations.length})</summary>
      <p className="mt-1 text-xs text-ink-muted">Correlation coefficients <i>r</i> between normal inputs (JCGM 101 §6.4.8); with any correlation <i>ν</i><sub>eff</sub> does not apply and <i>k</i> is the normal quantile.</p>
      <ul className="mt-1">
        {correlations.map((c, idx) => (
          <li key={c.between.join('-')} className="flex items-center gap-2 text-sm">
            <span className="whitespace-nowrap"><i>r</i>(<Sym name={c.between[0]} />, <Sym name={c.between[1]} />)</span>
            <input aria-label={`r between ${c.between[0]} and ${c.between[1]}`} type="number" step="0.01" min={-1} max={1} disabled={disabled} className="w-20 rounded-field border border-line-strong px-1 font-mono" value={c.r} onChange={(e) => onChange(correlations.map((x, j) => (j === idx ? { ...x, r: Math.max(-1, Math.min(1, Number(e.target.value))) } : x)))} />
            {!closed && <Button variant="quiet" className="px-2 py-0.5" disabled={disabled} onClick={() => onChange(correlations.filter((_, j) => j !== idx))}>Remove</Button>}
          </li>
        ))}
      </ul>
      {!closed && normals.length >= 2 && (
        <div className="mt-1 flex items-center gap-2 text-sm">
          <select aria-label="first input" value={a} onChange={(e) => setA(e.target.value)} className="rounded-field border border-line-strong px-1">
            <option value="">—</option>
            {normals.map((s) => <option key={s} value={s}>{symbolPlain(s)}</option>)}
          </select>
          <select aria-label="second input" value={b} onChange={(e) => setB(e.target.value)} className="rounded-field border border-line-strong px-1">
            <option value="">—</option>
            {normals.filter((s) => s !== a).map((s) => <option key={s} value={s}>{symbolPlain(s)}</option>)}
          </select>
          <Button variant="secondary" className="px-2 py-0.5" disabled={disabled || !a || !b || a === b} onClick={() => { onChange([...correlations, { between: [a, b], r: 0 }]); setA(''); setB(''); }}>Add correlation</Button>
        </div>
      )}
    </details>
  );
}
