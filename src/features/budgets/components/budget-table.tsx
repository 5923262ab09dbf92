import type { EvaluationResult } from '../../../../shared/engine';
import { formatNumber } from '../../../../shared/format/number';
import { formatUnit, inDisplayUnit, sensitivityUnit } from '../../../../shared/format/units';
import type { PointInput } from '../../../../shared/schemas/jobs.schema';
import { Sym } from '../../templates/components/math-tex';
import { UnitSlot } from '../../../components/ui/quantity';
import { distributionLabel } from './units';

const num = (v: number, digits = 4) => formatNumber(v, { digits: digits });

/**
 * Share of u²(y) in per cent, two significant digits; below 0.01 % it says so instead of printing
 * 0.000080 %, a figure that means nothing more and overran the bar beside it.
 */
export function formatShare(share: number): string {
  const pc = share * 100;
  if (pc > 0 && pc < 0.01) return '< 0.01 %';
  return `${formatNumber(pc, { digits: 2, notation: 'fixed' })} %`;
}

/**
 * The GUM budget (JCGM 100 §5.1, Annex G): per input its estimate, standard uncertainty,
 * distribution, sensitivity coefficient c_i, contribution |c_i| u(x_i), degrees of freedom and
 * share of u²(y), as a number and a bar. Estimates, u(x_i) and c_i are given in the unit chosen
 * for each input in the editor (`shownUnits`), the engine computing in SI.
 */
export function BudgetTable({ result, inputs, shownUnits = {} }: { result: EvaluationResult; inputs: PointInput[]; shownUnits?: Record<string, string | undefined> }) {
  const siOf = (s: string) => inputs.find((i) => i.symbol === s)?.unit ?? '';
  const y = formatUnit(result.unit);
  return (
    <table className="w-full border-collapse text-sm" aria-label="Uncertainty budget">
      <thead>
        <tr className="border-b border-line-strong text-left text-xs text-ink-muted">
          <th className="py-1.5 pr-2 font-semibold">Input</th>
          <th className="py-1.5 pr-2 text-right font-semibold">Estimate x<sub>i</sub></th>
          <th className="py-1.5 pr-2 text-right font-semibold">u(x<sub>i</sub>)</th>
          <th className="py-1.5 pr-2 font-semibold">Distribution</th>
          <th className="py-1.5 pr-2 text-right font-semibold">c<sub>i</sub></th>
          <th className="py-1.5 pr-2 text-right font-semibold">|c<sub>i</sub>| u(x<sub>i</sub>) / {y}</th>
          <th className="py-1.5 pr-2 text-right font-semibold">ν<sub>i</sub></th>
          <th className="py-1.5 font-semibold">Share of u²(y)</th>
        </tr>
      </thead>
      <tbody className="font-mono tabular-nums">
        {result.gum.budget.map((b) => {
          const d = inDisplayUnit(b, siOf(b.symbol), shownUnits[b.symbol]);
          return (
          <tr key={b.symbol} className="border-b border-line" data-symbol={b.symbol}>
            <td className="py-1 pr-2 font-sans"><Sym name={b.symbol} /></td>
            <td className="whitespace-nowrap py-1 pr-2 text-right">{num(d.estimate, 7)} <UnitSlot>{d.unit}</UnitSlot></td>
            <td className="whitespace-nowrap py-1 pr-2 text-right">{num(d.u, 3)} <UnitSlot>{d.unit}</UnitSlot></td>
            <td className="py-1 pr-2 font-sans">{distributionLabel(b.distribution)}</td>
            <td className="whitespace-nowrap py-1 pr-2 text-right">{num(d.c, 4)} <UnitSlot wide>{sensitivityUnit(y, d.unit)}</UnitSlot></td>
            <td className="py-1 pr-2 text-right">{num(b.contribution, 3)}</td>
            <td className="py-1 pr-2 text-right">{b.dof === 'infinite' ? '∞' : formatNumber(b.dof, { digits: 3 })}</td>
            <td className="py-1">
              <div className="flex items-center gap-2">
                <span className="w-20 shrink-0 whitespace-nowrap text-right">{formatShare(b.share)}</span>
                <span className="h-2 flex-1 rounded-sm bg-sunken" aria-hidden="true">
                  <span className="block h-2 rounded-sm bg-ember" style={{ width: `${Math.min(100, Math.max(0, b.share * 100))}%` }} />
                </span>
              </div>
            </td>
          </tr>
          );
        })}
      </tbody>
      <tfoot className="font-mono tabular-nums">
        <tr>
          <td className="py-1.5 pr-2 font-sans font-semibold"><Sym name={result.measurand} /></td>
          <td className="whitespace-nowrap py-1.5 pr-2 text-right font-semibold">{num(result.gum.y, 7)} <UnitSlot>{y}</UnitSlot></td>
          <td className="whitespace-nowrap py-1.5 pr-2 text-right font-semibold">{num(result.gum.u, 3)} <UnitSlot>{y}</UnitSlot></td>
          <td className="py-1.5 pr-2 font-sans text-ink-muted" colSpan={3}>
            u<sub>c</sub>(y); ν<sub>eff</sub> = {result.gum.nuEff === null ? 'not applicable (correlated inputs)' : result.gum.nuEff === 'infinite' ? '∞' : formatNumber(result.gum.nuEff, { digits: 3 })}
          </td>
          <td className="py-1.5 pr-2 text-right font-sans" colSpan={2}>
            k = {result.gum.k.toFixed(2)}, U = {result.reported.U} {y}
          </td>
        </tr>
      </tfoot>
    </table>
  );
}
