/**
 * The checks a job must pass before it goes to review (shown on the job page, enforced by
 * POST /api/jobs/:id/submit). Each reason names the point and the input it concerns.
 *
 * - Every input filled; a value of source "reference" names the standard it came from.
 * - Each point has a current result (computed after its last change) including Monte Carlo.
 * - GUM against Monte Carlo (JCGM 101 §8): when the validation fails the Monte Carlo result is
 *   the one reported, with a note (not a refusal).
 * - The reported U is not below the CMC for the point (ILAC-P14:09/2020 §5.4), unless the point
 *   is marked outside the scope of accreditation with a reason.
 * - No reference standard used is past its due date on the day of the check.
 *
 * Messages name an input by its symbol as the budget table writes it (ε_bb for eps_bb, ISO
 * 80000-1 §7.1) and figures as shared/format prints them; the model identifier stays in the
 * reason's `symbol` field, which the client uses to place the reason beside its input.
 */
import type { EvaluationResult } from '../../../shared/engine';
import { formatQuantity, printedUnit } from '../../../shared/format/units';
import { symbolPlain } from '../../../shared/format/symbols';
import type { PointInput, SubmitReason } from '../../../shared/schemas/jobs.schema';
import type { TemplateDefinition } from '../../../shared/schemas/template.schema';
import type { BudgetStandard } from './sources';

export type CheckPoint = {
  id: string;
  position: number;
  nominalValue: number;
  nominalUnit: string;
  inputs: PointInput[];
  outsideScope: boolean;
  outsideScopeReason: string | null;
  result: EvaluationResult | null;
  computedAt: Date | null;
  changedAt: Date;
};

export type PointReport = {
  /** Value, U, k and coverage interval that go to the certificate. */
  method: 'gum' | 'monte-carlo';
  y: number;
  U: number;
  k: number | null;
  interval: [number, number];
  note: string | null;
};

/** What is reported for a point: GUM, or Monte Carlo when the §8 validation failed. */
export function reportedResult(result: EvaluationResult): PointReport {
  if (result.mcm && result.validation && !result.validation.passed) {
    const { y, interval } = result.mcm;
    // The larger half of the coverage interval, so that y ± U covers it (the interval may be asymmetric).
    const U = Math.max(y - interval[0], interval[1] - y);
    return {
      method: 'monte-carlo',
      y,
      U,
      k: null,
      interval,
      note: 'The GUM result did not pass the validation against Monte Carlo (JCGM 101 §8): the Monte Carlo result and its coverage interval are reported.',
    };
  }
  return { method: 'gum', y: result.gum.y, U: result.gum.U, k: result.gum.k, interval: result.gum.interval, note: null };
}

/** The CMC that applies to the point, in the measurand's unit, or null when no row covers it. */
export function cmcForPoint(def: TemplateDefinition, result: EvaluationResult): { U: number; basisValue: number; basis: string; row: number } | null | undefined {
  const cmc = def.cmc;
  if (!cmc || cmc.rows.length === 0) return undefined;
  const basis = cmc.basis ?? def.measurand.symbol;
  const basisValue = basis === def.measurand.symbol ? result.gum.y : result.gum.budget.find((b) => b.symbol === basis)?.estimate;
  if (basisValue === undefined) return null;
  // Ranges are half-open [from, to), the last one closed, so a value on a boundary takes the upper row.
  const rows = cmc.rows;
  const i = rows.findIndex((r, idx) => basisValue >= r.from && (basisValue < r.to || (idx === rows.length - 1 && basisValue === r.to)));
  const j = i >= 0 ? i : rows.findIndex((r) => basisValue >= r.from && basisValue <= r.to);
  if (j < 0) return null;
  const row = rows[j];
  return { U: row.relative ? row.U * Math.abs(result.gum.y) : row.U, basisValue, basis, row: j };
}

export function isCurrent(p: Pick<CheckPoint, 'result' | 'computedAt' | 'changedAt'>): boolean {
  return Boolean(p.result && p.computedAt && p.computedAt.getTime() >= p.changedAt.getTime());
}

export type CheckOutcome = { reasons: SubmitReason[]; notes: SubmitReason[] };

export function checkJob(args: {
  definition: TemplateDefinition;
  points: CheckPoint[];
  standards: Map<string, BudgetStandard | null>;
  /** YYYY-MM-DD of the check (from the injectable clock). */
  today: string;
}): CheckOutcome {
  const reasons: SubmitReason[] = [];
  const notes: SubmitReason[] = [];
  const add = (list: SubmitReason[], code: string, message: string, p: CheckPoint | null, symbol: string | null = null) =>
    list.push({ code, message, pointId: p?.id ?? null, pointPosition: p?.position ?? null, symbol });

  if (args.points.length === 0) add(reasons, 'NO_POINTS', 'The job has no calibration points: add at least one.', null);

  for (const p of args.points) {
    const label = `Point ${p.position}`;
    for (const input of p.inputs) {
      const name = symbolPlain(input.symbol);
      if (input.distribution === null) {
        const how = input.source === 'readings' ? 'enter or upload its readings' : input.source === 'reference' ? 'take it from a reference standard' : 'enter its value and distribution';
        add(reasons, 'INPUT_MISSING', `${label}: ${name} has no value yet: ${how}.`, p, input.symbol);
      } else if (input.source === 'reference' && !input.standardId) {
        add(reasons, 'REFERENCE_NOT_NAMED', `${label}: ${name} should come from a reference standard's certificate: pick the standard used.`, p, input.symbol);
      }
      if (input.standardId) {
        const s = args.standards.get(input.standardId);
        if (!s) add(reasons, 'STANDARD_UNKNOWN', `${label}: the reference standard of ${name} is not in the register.`, p, input.symbol);
        else if (s.dueDate && s.dueDate < args.today)
          add(reasons, 'STANDARD_OVERDUE', `${label}: ${name} comes from ${s.name}${s.identifier ? ` (${s.identifier})` : ''}, whose calibration was due on ${s.dueDate}: recalibrate it or use another standard.`, p, input.symbol);
      }
    }
    if (!p.result) {
      add(reasons, 'NO_RESULT', `${label}: there is no result yet: run the calculation and Monte Carlo.`, p);
      continue;
    }
    if (!isCurrent(p)) add(reasons, 'RESULT_STALE', `${label}: the budget changed after the last calculation: run it again.`, p);
    else if (!p.result.mcm) add(reasons, 'NO_MONTE_CARLO', `${label}: Monte Carlo has not been run for the current budget: run it to validate the GUM result (JCGM 101 §8).`, p);
    const rep = reportedResult(p.result);
    if (rep.note) add(notes, 'MCM_REPORTED', `${label}: ${rep.note}`, p);
    const cmc = cmcForPoint(args.definition, p.result);
    const scoped = p.outsideScope && (p.outsideScopeReason ?? '').trim().length > 0;
    if (cmc === null) {
      if (!scoped) add(reasons, 'OUTSIDE_CMC_RANGE', `${label}: the point lies outside every CMC range of the model: mark it as outside the scope of accreditation, with the reason.`, p);
    } else if (cmc && rep.U < cmc.U * (1 - 1e-9)) {
      const unit = printedUnit(p.result.unit);
      const msg = `${label}: U = ${formatQuantity(rep.U, unit, { digits: 2 })} is below the CMC of ${formatQuantity(cmc.U, unit, { digits: 2 })} for this range (ILAC-P14 §5.4): check the budget, or mark the point outside the scope of accreditation with the reason.`;
      if (!scoped) add(reasons, 'U_BELOW_CMC', msg, p);
      else add(notes, 'OUTSIDE_SCOPE', `${label}: reported outside the scope of accreditation: ${p.outsideScopeReason}`, p);
    }
    if (p.result.warnings.length) for (const w of p.result.warnings) if (!/report the Monte Carlo result/.test(w)) add(notes, 'ENGINE_WARNING', `${label}: ${w}`, p);
  }
  return { reasons, notes };
}
