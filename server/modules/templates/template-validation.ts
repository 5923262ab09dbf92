/**
 * Release validation of a template (ISO/IEC 17025:2017 §7.2.2, validation of methods): the
 * document is well-formed, every equation can be read, every symbol is defined, units are
 * consistent, the model evaluates at the defaults, and the attached reference case reproduces
 * within its tolerance. Each check is recorded with pass/fail and its messages; a check that
 * cannot run because an earlier one failed is recorded as not run (passed: null).
 */
import { checkEquations, checkUnits, ENGINE_VERSION, EngineError, evaluateGum, type EvaluationResult } from '../../../shared/engine';
import {
  budgetFromTemplate,
  starterDefinition,
  templateDefinitionSchema,
  VALIDATION_CHECK_LABELS,
  VALIDATION_CHECKS,
  type Person,
  type TemplateDefinition,
  type ValidationCheck,
  type ValidationCheckId,
  type ValidationMessage,
  type ValidationRecord,
} from '../../../shared/schemas/template.schema';

export type ValidationMeta = { purpose: ValidationRecord['purpose']; by: Person; at: Date };

const pathOf = (p: ReadonlyArray<PropertyKey>) => p.map((x) => (typeof x === 'number' ? x : String(x)));

function engineMessage(e: unknown): ValidationMessage {
  if (e instanceof EngineError) {
    const at = e.position !== undefined ? ` (at character ${e.position + 1})` : '';
    return {
      message: `${e.message}${at}`,
      ...(e.path ? { path: e.path } : e.equation !== undefined ? { path: ['equations', e.equation] } : {}),
      ...(e.equation !== undefined ? { equation: e.equation } : {}),
      ...(e.position !== undefined ? { position: e.position } : {}),
    };
  }
  return { message: e instanceof Error ? e.message : String(e) };
}

/** Tolerance on y of a reference case: the larger of the absolute and the relative bound. */
export function referenceTolerance(rc: NonNullable<TemplateDefinition['referenceCase']>): number {
  return Math.max(rc.tolerance.yAbs ?? 0, (rc.tolerance.yRel ?? 0) * Math.abs(rc.expected.y));
}

export function validateTemplate(raw: unknown, meta: ValidationMeta): ValidationRecord {
  const results = new Map<ValidationCheckId, { passed: boolean | null; messages: ValidationMessage[] }>();
  const set = (id: ValidationCheckId, messages: ValidationMessage[]) => results.set(id, { passed: messages.length === 0, messages });
  const warnings: string[] = [];
  let result: ValidationRecord['result'] = null;
  let referenceCase: ValidationRecord['referenceCase'] = null;
  const inputs: Record<string, number> = {};

  const finish = (): ValidationRecord => {
    const checks: ValidationCheck[] = VALIDATION_CHECKS.map((id) => ({
      id,
      label: VALIDATION_CHECK_LABELS[id],
      passed: results.get(id)?.passed ?? null,
      messages: results.get(id)?.messages ?? [],
    }));
    return {
      purpose: meta.purpose,
      passed: checks.every((c) => c.passed === true),
      engineVersion: ENGINE_VERSION,
      checkedAt: meta.at.toISOString(),
      checkedBy: meta.by,
      checks,
      inputs,
      result,
      referenceCase,
      warnings,
    };
  };

  // 1. The document.
  const parsed = templateDefinitionSchema.safeParse(raw);
  if (!parsed.success) {
    set('schema', parsed.error.issues.map((i) => ({ path: pathOf(i.path), message: `${i.path.length ? pathOf(i.path).join('.') : 'template'}: ${i.message}` })));
    return finish();
  }
  const t = parsed.data;
  // A draft made from a name starts with placeholder wording (starterDefinition): release asks for the real text.
  const starter = starterDefinition(t.name);
  const placeholders: ValidationMessage[] = [];
  if (t.certificate.methodStatement === starter.certificate.methodStatement) placeholders.push({ path: ['certificate', 'methodStatement'], message: 'the method statement is still the starter text: write the method as the certificate should state it' });
  if (t.measurand.description === starter.measurand.description) placeholders.push({ path: ['measurand', 'description'], message: 'the measurand description is still the starter text: describe the measurand' });
  t.inputs.forEach((i, n) => {
    if (i.description === starter.inputs[0].description) placeholders.push({ path: ['inputs', n, 'description'], message: `the meaning of input "${i.symbol}" is still the starter text: say what the quantity is` });
  });
  set('schema', placeholders);
  if (placeholders.length) return finish();

  // 2 and 3. Equations and symbols (one pass of the allow-list check).
  const known = [...t.inputs.map((i) => i.symbol), ...Object.keys(t.constants ?? {})];
  const checked = checkEquations(t.equations, known);
  const asMessage = (e: (typeof checked.errors)[number]): ValidationMessage => ({
    message: `${e.message} (at character ${e.position + 1})`,
    path: ['equations', e.equation],
    equation: e.equation,
    position: e.position,
    length: e.length,
  });
  const symbolProblems = checked.errors.filter((e) => e.code === 'UNKNOWN_SYMBOL').map(asMessage);
  const parseProblems = checked.errors.filter((e) => e.code !== 'UNKNOWN_SYMBOL').map(asMessage);
  if (!checked.defines.includes(t.measurand.symbol)) {
    symbolProblems.push({ path: ['measurand', 'symbol'], message: `the measurand "${t.measurand.symbol}" is not defined by any equation: the last equation should read "${t.measurand.symbol} = …"` });
  }
  const used = new Set(checked.checked.flatMap((c) => c.symbols));
  for (const i of t.inputs) if (!used.has(i.symbol)) warnings.push(`input "${i.symbol}" is not used by any equation`);
  set('equations', parseProblems);
  set('symbols', symbolProblems);
  if (parseProblems.length || symbolProblems.length) return finish();

  // 4. Units. A quantity without a unit would leave terms unchecked, so release asks for one.
  const budget = budgetFromTemplate(t);
  const unitProblems: ValidationMessage[] = [];
  if (!t.measurand.unit) unitProblems.push({ path: ['measurand', 'unit'], message: `the measurand "${t.measurand.symbol}" has no unit: give its SI unit, or 1 if it is dimensionless` });
  t.inputs.forEach((i, n) => {
    if (!i.unit) unitProblems.push({ path: ['inputs', n, 'unit'], message: `input "${i.symbol}" has no unit: give its SI unit, or 1 if it is dimensionless` });
  });
  for (const c of Object.keys(t.constants ?? {})) {
    if (!t.constantUnits?.[c]) unitProblems.push({ path: ['constantUnits', c], message: `constant "${c}" has no unit: give its SI unit in constantUnits, or 1 if it is dimensionless` });
  }
  const units = checkUnits(budget);
  for (const e of units.errors) unitProblems.push({ message: e.message, ...(e.path ? { path: e.path } : {}), ...(e.equation !== undefined ? { equation: e.equation } : {}) });
  for (const w of units.warnings) if (!/has no unit/.test(w)) warnings.push(w);
  set('units', unitProblems);
  if (unitProblems.length) return finish();

  // 5. Evaluation at the defaults.
  let atDefaults: EvaluationResult;
  try {
    atDefaults = evaluateGum(budget);
  } catch (e) {
    set('evaluates', [engineMessage(e)]);
    return finish();
  }
  const g = atDefaults.gum;
  for (const row of g.budget) inputs[row.symbol] = row.estimate;
  result = { y: g.y, u: g.u, U: g.U, k: g.k, nuEff: g.nuEff, unit: atDefaults.unit };
  warnings.push(...atDefaults.warnings);
  const evalProblems: ValidationMessage[] = [];
  if (!Number.isFinite(g.y)) evalProblems.push({ message: `the model gives ${g.y} for "${t.measurand.symbol}" at the default values` });
  if (!Number.isFinite(g.u)) evalProblems.push({ message: `the standard uncertainty of "${t.measurand.symbol}" is ${g.u} at the default values` });
  set('evaluates', evalProblems);
  if (evalProblems.length) return finish();

  // 6. The reference case.
  const rc = t.referenceCase;
  if (!rc) {
    set('reference-case', [{ path: ['referenceCase'], message: 'the template has no reference case: add input values with the expected y and u(y) from an independent calculation or a published example, and their tolerance' }]);
    return finish();
  }
  const tolY = referenceTolerance(rc);
  const rcInputs = rc.inputs ?? {};
  const unknownOverrides = Object.keys(rcInputs).filter((s) => !t.inputs.some((i) => i.symbol === s));
  const rcProblems: ValidationMessage[] = unknownOverrides.map((s) => ({ path: ['referenceCase', 'inputs', s], message: `the reference case sets "${s}", which is not an input quantity` }));
  let obtained: { y: number; u: number } | null = null;
  if (!rcProblems.length) {
    try {
      const r = evaluateGum(budgetFromTemplate(t, rcInputs)).gum;
      obtained = { y: r.y, u: r.u };
      const dy = Math.abs(r.y - rc.expected.y);
      if (!(dy <= tolY)) rcProblems.push({ path: ['referenceCase', 'expected', 'y'], message: `the reference case gives y = ${r.y.toPrecision(10)}, expected ${rc.expected.y} within ${tolY.toPrecision(3)} (difference ${dy.toPrecision(3)})` });
      const du = rc.expected.u === 0 ? Math.abs(r.u) : Math.abs(r.u - rc.expected.u) / rc.expected.u;
      if (!(du <= rc.tolerance.uRel)) rcProblems.push({ path: ['referenceCase', 'expected', 'u'], message: `the reference case gives u(y) = ${r.u.toPrecision(6)}, expected ${rc.expected.u} within ${(rc.tolerance.uRel * 100).toPrecision(3)} % (relative difference ${(du * 100).toPrecision(3)} %)` });
    } catch (e) {
      rcProblems.push(engineMessage(e));
    }
  }
  referenceCase = { source: rc.source, inputs: rcInputs, expected: rc.expected, obtained, tolerance: { y: tolY, uRel: rc.tolerance.uRel } };
  set('reference-case', rcProblems);
  return finish();
}
