import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { EngineError, evaluateGum, type EvaluationResult } from '../../../../shared/engine';
import { api, ApiError } from '../../../lib/api-client';
import { formatCoverageFactor, formatNumber, formatQuantity, formatResult, inDisplayUnit, printedUnit, sensitivityUnit } from '../../../../shared/format';
import { budgetFromTemplate, type TemplateDefinition } from '../../../../shared/schemas/template.schema';
import { Notice } from '../../../components/ui/notice';
import { MathTex, Sym } from './math-tex';

const DIST_WORDS: Record<string, string> = {
  normal: 'normal', rectangular: 'rectangular', triangular: 'triangular', arcsine: 'arcsine', trapezoidal: 'trapezoidal',
  'curvilinear-trapezoid': 'trapezoid, inexact limits', 'student-t': 'Student t', readings: 'Type A readings', exponential: 'exponential', gamma: 'gamma', constant: 'exact',
};

type Outcome = { result: EvaluationResult } | { error: string } | { blocked: true };

function evaluateSafely(def: TemplateDefinition): Outcome {
  try {
    return { result: evaluateGum(budgetFromTemplate(def), { codegen: false }) };
  } catch (e) {
    if (e instanceof EngineError) return { error: e.position !== undefined ? `${e.message} (at character ${e.position + 1})` : e.message };
    // The engine compiles the model to a JavaScript function; a page whose Content Security
    // Policy forbids that (no 'unsafe-eval') cannot run it, so the same engine runs on the server.
    if (e instanceof EvalError || /unsafe-eval|Content Security Policy/i.test(String((e as Error)?.message))) return { blocked: true };
    return { error: e instanceof Error ? e.message : String(e) };
  }
}

/** POST /api/calculations/gum: the stateless GUM evaluation on the server (the same engine). */
function useServerGum(def: TemplateDefinition | null, enabled: boolean) {
  const budget = useMemo(() => (def ? budgetFromTemplate(def) : null), [def]);
  return useQuery({
    queryKey: ['calculations', 'result', JSON.stringify(budget)],
    enabled: enabled && budget !== null,
    staleTime: Infinity,
    retry: false,
    queryFn: async ({ signal }) => (await api.post<{ result: EvaluationResult }>('/api/calculations/gum', { budget }, { signal })).result,
  });
}

const n3 = (v: number) => formatNumber(v, { digits: 3 });

/** The GUM budget at the template's defaults, computed in the browser (JCGM 100 §5.1, G.4). */
export function BudgetPreview({ definition }: { definition: TemplateDefinition | null }) {
  const local = useMemo(() => (definition ? evaluateSafely(definition) : null), [definition]);
  const blocked = !!local && 'blocked' in local;
  const server = useServerGum(definition, blocked);
  if (!definition) {
    return <Notice tone="warn" label="No preview">The preview appears when the form has no marked problems.</Notice>;
  }
  let out: Outcome | null = local;
  if (blocked) {
    if (server.isPending) return <p className="text-sm text-ink-muted" role="status">Calculating the budget…</p>;
    out = server.error ? { error: server.error instanceof ApiError ? server.error.message : String(server.error) } : { result: server.data! };
  }
  if (!out || 'error' in out || 'blocked' in out) {
    return <Notice tone="warn" label="The model cannot be evaluated yet">{out && 'error' in out ? out.error : ''}</Notice>;
  }
  const { gum, unit } = out.result;
  const yUnit = printedUnit(unit);
  const inputs = new Map(definition.inputs.map((i) => [i.symbol, i]));
  const ySym = definition.measurand.symbol;
  const nuEff = gum.nuEff === 'infinite' ? '∞' : gum.nuEff === null ? 'not applicable (correlated inputs)' : formatNumber(gum.nuEff, { digits: 3 });
  return (
    <div className="space-y-3">
      <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">GUM uncertainty budget at the default values</caption>
        <thead>
          <tr className="border-b border-line-strong text-left text-xs text-ink-muted">
            <th scope="col" className="py-1 pr-2 font-semibold">Quantity</th>
            <th scope="col" className="px-2 text-right font-semibold">Estimate <MathTex tex="x_i" /></th>
            <th scope="col" className="px-2 text-right font-semibold">Std. uncertainty <MathTex tex="u(x_i)" /></th>
            <th scope="col" className="px-2 font-semibold">Distribution</th>
            <th scope="col" className="px-2 text-right font-semibold">Sensitivity <MathTex tex="c_i" /></th>
            <th scope="col" className="px-2 text-right font-semibold">Contribution <MathTex tex="|c_i|\,u(x_i)" /></th>
            <th scope="col" className="px-2 text-right font-semibold"><MathTex tex="\nu_i" /></th>
            <th scope="col" className="pl-2 font-semibold">Share</th>
          </tr>
        </thead>
        <tbody>
          {gum.budget.map((row) => {
            // In the unit the model shows the input in (°C, µm), as its defaults are typed; the engine's figures are SI.
            const input = inputs.get(row.symbol);
            const d = inDisplayUnit(row, input?.unit ?? '', input?.displayUnit);
            const cUnit = sensitivityUnit(unit, d.unit);
            return (
              <tr key={row.symbol} className="border-b border-line align-baseline">
                <th scope="row" className="py-1 pr-2 text-left font-normal"><Sym name={row.symbol} /></th>
                <td className="numeric px-2 whitespace-nowrap">{formatQuantity(d.estimate, d.unit, d.estimate === 0 ? {} : { digits: 6 })}</td>
                <td className="numeric px-2 whitespace-nowrap">{formatQuantity(d.u, d.unit, { digits: 3 })}</td>
                <td className="px-2 text-ink-muted">{DIST_WORDS[row.distribution] ?? row.distribution}</td>
                <td className="numeric px-2 whitespace-nowrap">{n3(d.c)}{cUnit && <span className="text-ink-muted"> {cUnit}</span>}</td>
                <td className="numeric px-2 whitespace-nowrap">{formatQuantity(row.contribution, yUnit, { digits: 3 })}</td>
                <td className="numeric px-2">{row.dof === 'infinite' ? '∞' : formatNumber(row.dof, { digits: 3 })}</td>
                <td className="pl-2">
                  <span className="flex items-center gap-2">
                    <span className="numeric w-12 shrink-0">{formatNumber(row.share * 100, { decimals: 1, notation: 'fixed' })} %</span>
                    <span aria-hidden="true" className="h-2 w-20 shrink-0 rounded-pill bg-sunken">
                      <span className="block h-2 rounded-pill bg-ember" style={{ width: `${Math.max(row.share > 0 ? 2 : 0, row.share * 100)}%` }} />
                    </span>
                  </span>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      </div>
      <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt><Sym name={ySym} /></dt>
        <dd className="numeric text-left">{formatQuantity(gum.y, yUnit, { digits: 7 })}</dd>
        <dt><MathTex tex={`u_{\\mathrm{c}}(${ySym.length === 1 ? ySym : 'y'})`} /></dt>
        <dd className="numeric text-left">{formatQuantity(gum.u, yUnit, { digits: 3 })}</dd>
        <dt><MathTex tex="\nu_{\mathrm{eff}}" /></dt>
        <dd className="numeric text-left">{nuEff}</dd>
        <dt><MathTex tex="k" /></dt>
        <dd className="numeric text-left">{formatCoverageFactor(gum.k)}</dd>
        <dt><MathTex tex="U" /></dt>
        <dd className="numeric text-left">{formatQuantity(gum.U, yUnit, { digits: 2 })}</dd>
      </dl>
      <p className="text-sm">
        <span className="font-semibold">Result at the defaults: </span>
        <span className="font-mono tabular-nums">{formatResult(gum.y, gum.U, yUnit, gum.k, gum.coverage)}</span>
      </p>
      {out.result.warnings.length > 0 && (
        <Notice tone="info" label="Notes from the calculation">
          <ul className="list-disc pl-5">{out.result.warnings.map((w) => <li key={w}>{w}</li>)}</ul>
        </Notice>
      )}
    </div>
  );
}
