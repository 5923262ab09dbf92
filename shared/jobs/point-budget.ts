/**
 * A calibration point's budget document: the template's model (measurand, equations,
 * constants, coverage, Monte Carlo settings) with the point's filled inputs and correlations.
 * Used by the browser (live GUM table) and the server (stored results) alike.
 */
import type { BudgetDocument } from '../schemas/budget.schema';
import type { PointInput } from '../schemas/jobs.schema';
import type { TemplateDefinition, TemplateInput } from '../schemas/template.schema';

export type PointBudgetSource = {
  inputs: PointInput[];
  correlations: Array<{ between: [string, string]; r: number }>;
};

/** Inputs still to be filled (distribution null). */
export function missingInputs(point: PointBudgetSource): PointInput[] {
  return point.inputs.filter((i) => i.distribution === null);
}

/**
 * The budget document of the point, or null while an input is not filled. Lab-workflow fields
 * (source, displayUnit, standardId …) are left out: the engine gets the plain document.
 */
export function pointBudget(def: TemplateDefinition, point: PointBudgetSource): BudgetDocument | null {
  if (missingInputs(point).length) return null;
  return {
    measurand: def.measurand,
    equations: def.equations,
    constants: def.constants,
    constantUnits: def.constantUnits,
    inputs: point.inputs.map((i) => ({
      symbol: i.symbol,
      unit: i.unit,
      description: i.description,
      distribution: i.distribution!,
      ...(i.dof === undefined ? {} : { dof: i.dof }),
    })),
    correlations: point.correlations,
    coverage: def.coverage,
    monteCarlo: def.monteCarlo,
    reportDigits: def.reportDigits,
  };
}

/**
 * The inputs of a new point: fixed and analyst-entered (Type B) values start at the template's
 * defaults; readings and reference-standard values start empty, to be filled from this job's
 * own readings and the certificates of the standards actually used.
 */
export function initialPointInputs(def: TemplateDefinition): PointInput[] {
  return def.inputs.map((i: TemplateInput) => ({
    symbol: i.symbol,
    unit: i.unit,
    description: i.description,
    displayUnit: i.displayUnit,
    source: i.source,
    referenceKind: i.referenceKind,
    distribution: i.source === 'readings' || i.source === 'reference' ? null : i.distribution,
    ...(i.dof === undefined ? {} : { dof: i.dof }),
    standardId: null,
  }));
}
