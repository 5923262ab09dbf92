/**
 * Compile a budget document's model into a scalar function, a vectorised Monte Carlo kernel and
 * sensitivity coefficients, from the allow-listed tree only (./check.ts). See ./codegen.ts for
 * why the code is generated here rather than evaluated by mathjs.
 */
import type { BudgetDocument } from '../../schemas/budget.schema';
import { EngineError } from '../errors';
import type { CompiledModel } from '../types';
import { checkEquations, type CheckedEquation } from './check';
import { bindFunctions, generate, numberLiteral } from './codegen';
import { closure, isCodeGenerationRefused, type ClosureEnv, type NumberClosure } from './closures';
import { countNodes, makeInputsOf, prepareForDerivative, type Placeholder } from './expand';
import type { RadiometricLibrary } from './library-types';
import { derivative, type MathNode } from './math';
import { expressionText, quantityName, quantityNames } from './names';

/** Machine epsilon of IEEE 754 binary64. */
const EPS = 2 ** -52;
/** Largest prepared tree differentiated symbolically; larger models use central differences. */
const MAX_SYMBOLIC_NODES = 20_000;

export interface CompiledModelDetails extends CompiledModel {
  /** The equations the measurand depends on, in evaluation order. */
  equations: CheckedEquation[];
  /** Values of every needed equation at x (no finiteness check). */
  evaluateAll(x: ArrayLike<number>): number[];
  /** Sensitivities with steps scaled by `scale` (the inputs' standard uncertainties). */
  sensitivities(x: ArrayLike<number>, scale?: ArrayLike<number>): { c: number[]; method: Array<'symbolic' | 'numeric'> };
  /** ∂²f/∂x_i∂x_j and ∂³f/∂x_i∂x_j² at x by central differences of the gradient (GUM 5.1.2 note). */
  secondOrder(x: ArrayLike<number>, scale?: ArrayLike<number>): { hessian: number[][]; third: number[][] };
  /** Generated JS source, for review and debugging. */
  source: { scalar: string; gradient: string | null };
}

/**
 * Central-difference step for ∂f/∂x at x: h = ε^(1/3)·max(|x|, u(x)), or ε^(1/3) when both are
 * zero. With truncation error O(h²) and round-off O(ε/h), the total error of a central
 * difference is smallest for h ∝ ε^(1/3) times the scale of x (standard numerical-analysis
 * result: Nocedal & Wright, Numerical Optimization, 2nd ed., §8.1). For second differences the
 * same argument gives ε^(1/4). The step is then made exactly representable, (x + h) − x.
 */
export function differenceStep(x: number, u: number | undefined, power: 3 | 4 = 3): number {
  const scale = Math.max(Math.abs(x), u !== undefined && Number.isFinite(u) ? Math.abs(u) : 0);
  const h = Math.pow(EPS, 1 / power) * (scale > 0 ? scale : 1);
  const exact = x + h - x;
  return exact > 0 ? exact : h;
}

/**
 * Compile `doc`'s model against a radiometric library (./index.ts binds the real one). Throws
 * EngineError on any refused equation or an undefined measurand.
 */
export interface CompileOptions {
  /**
   * Generate JavaScript source (default). When false — or when the runtime refuses `new Function`,
   * as a browser page under a Content-Security-Policy without 'unsafe-eval' does — the same tree
   * is evaluated through closures (./closures.ts) with the same arithmetic.
   */
  codegen?: boolean;
}

export function compileModelWith(doc: BudgetDocument, library: RadiometricLibrary, options: CompileOptions = {}): CompiledModelDetails {
  let codegen = options.codegen !== false;
  const makeFunction = (param: string, source: string): unknown => {
    if (!codegen) throw new EvalError('code generation disabled');
    try {
      return new Function(param, source)(library.functions);
    } catch (e) {
      if (isCodeGenerationRefused(e)) codegen = false;
      throw e;
    }
  };
  const inputSymbols = doc.inputs.map((i) => i.symbol);
  const constants = doc.constants ?? {};
  const checked = checkEquations(doc.equations, [...inputSymbols, ...Object.keys(constants)]);
  if (!checked.ok) {
    const first = checked.errors[0];
    const all = checked.errors.map((e) => e.message).join('; ');
    throw new EngineError(first.code, all, { equation: first.equation, position: first.position, path: ['equations', first.equation] });
  }
  const measurand = doc.measurand?.symbol ?? checked.defines[checked.defines.length - 1];
  const defining = checked.checked.find((e) => e.target === measurand);
  if (!defining) {
    throw new EngineError('UNDEFINED_MEASURAND', `the measurand ${quantityName(measurand)} is not defined by any equation (defined: ${quantityNames(checked.defines) || 'none'})`, { path: ['measurand', 'symbol'] });
  }

  // Keep only the equations the measurand depends on.
  const byTarget = new Map(checked.checked.map((e) => [e.target, e]));
  const needed = new Set<string>();
  const stack = [measurand];
  while (stack.length) {
    const s = stack.pop() as string;
    if (needed.has(s)) continue;
    const eq = byTarget.get(s);
    if (!eq) continue;
    needed.add(s);
    for (const dep of eq.symbols) if (byTarget.has(dep) && byTarget.get(dep)!.index < eq.index) stack.push(dep);
  }
  const equations = checked.checked.filter((e) => needed.has(e.target) && e.index <= defining.index);

  const inputIndex = new Map(inputSymbols.map((s, i) => [s, i]));
  const libraryValue = (name: string): number | undefined => (name === 'pi' ? Math.PI : Object.prototype.hasOwnProperty.call(library.constants, name) ? library.constants[name] : undefined);

  // Value code: one statement per equation, symbols resolved in order of precedence
  // (earlier intermediate > input > document constant > library constant).
  type Resolved = { kind: 'local'; k: number } | { kind: 'input'; i: number } | { kind: 'value'; value: number };
  const locals = new Map<string, number>();
  const usedInputs = new Set<number>();
  const statements: string[] = [];
  const resolvers: Array<(name: string) => Resolved> = [];
  equations.forEach((eq, k) => {
    const known = new Map(locals);
    const resolve = (name: string): Resolved => {
      const local = known.get(name);
      if (local !== undefined) return { kind: 'local', k: local };
      const i = inputIndex.get(name);
      if (i !== undefined) return { kind: 'input', i };
      if (Object.prototype.hasOwnProperty.call(constants, name)) return { kind: 'value', value: constants[name] };
      const v = libraryValue(name);
      if (v !== undefined) return { kind: 'value', value: v };
      throw new EngineError('UNKNOWN_SYMBOL', `equation ${eq.index + 1}: ${quantityName(name)} has no value`, { equation: eq.index });
    };
    const symbol = (name: string): string => {
      const r = resolve(name);
      if (r.kind === 'local') return `v${r.k}`;
      if (r.kind === 'input') {
        usedInputs.add(r.i);
        return `a${r.i}`;
      }
      return numberLiteral(r.value);
    };
    statements.push(`const v${k} = ${generate(eq.expr, symbol)};`);
    resolvers.push(resolve);
    locals.set(eq.target, k);
  });
  const last = `v${equations.length - 1}`;
  const readX = [...usedInputs].sort((a, b) => a - b).map((i) => `const a${i} = x[${i}];`).join(' ');
  const readCols = [...usedInputs].sort((a, b) => a - b).map((i) => `const c${i} = cols[${i}];`).join(' ');
  const readT = [...usedInputs].sort((a, b) => a - b).map((i) => `const a${i} = c${i}[t];`).join(' ');
  const body = statements.join('\n  ');
  const scalarSource = `"use strict";
${bindFunctions()}
function all(x) {
  ${readX}
  ${body}
  return [${equations.map((_, k) => `v${k}`).join(', ')}];
}
function measurand(x) {
  ${readX}
  ${body}
  return ${last};
}
function kernel(cols, out, n) {
  ${readCols}
  for (let t = 0; t < n; t++) {
    ${readT}
    ${body}
    out[t] = ${last};
  }
}
return { all, measurand, kernel };`;
  type Built = {
    all(x: ArrayLike<number>): number[];
    measurand(x: ArrayLike<number>): number;
    kernel(cols: Float64Array[], out: Float64Array, n: number): void;
  };
  const fromClosures = (): Built => {
    const fns = equations.map((eq, k) =>
      closure(eq.expr, (name): NumberClosure => {
        const r = resolvers[k](name);
        if (r.kind === 'local') {
          const j = r.k;
          return (e) => e.v[j];
        }
        if (r.kind === 'input') {
          const i = r.i;
          return (e) => e.x[i];
        }
        const c = r.value;
        return () => c;
      }, library.functions),
    );
    const all = (x: ArrayLike<number>): number[] => {
      const env: ClosureEnv = { x, v: [], named: {} };
      for (let k = 0; k < fns.length; k++) env.v[k] = fns[k](env);
      return env.v;
    };
    return {
      all,
      measurand: (x) => all(x)[fns.length - 1],
      kernel(cols, out, n) {
        const x = new Array<number>(cols.length);
        for (let t = 0; t < n; t++) {
          for (let i = 0; i < cols.length; i++) x[i] = cols[i][t];
          out[t] = all(x)[fns.length - 1];
        }
      },
    };
  };
  let built: Built;
  try {
    built = makeFunction('F', scalarSource) as Built;
  } catch (e) {
    if (codegen) throw e;
    built = fromClosures();
  }

  const scalar = (x: ArrayLike<number>): number => {
    const y = built.measurand(x);
    if (Number.isFinite(y)) return y;
    const values = built.all(x);
    const k = values.findIndex((v) => !Number.isFinite(v));
    const eq = equations[k >= 0 ? k : equations.length - 1];
    const v = values[k >= 0 ? k : values.length - 1];
    throw new EngineError('NON_FINITE', `equation ${eq.index + 1} ("${quantityName(eq.target)} = ${expressionText(eq.expr)}") evaluates to ${v} (an overflow or an undefined operation such as the logarithm of a negative number) at the input values used`, { equation: eq.index, path: ['equations', eq.index] });
  };

  // Symbolic derivatives of the fully substituted, expanded measurand.
  const inputSet = new Set(inputSymbols);
  const placeholders: Placeholder[] = [];
  let inputsOf = makeInputsOf(inputSet, placeholders);
  const prepared = new Map<string, MathNode>();
  let symbolicPossible = true;
  let full: MathNode | null = null;
  try {
    for (const eq of equations) {
      const resolve = (name: string) => {
        const tree = prepared.get(name);
        if (tree) return { kind: 'tree' as const, tree };
        if (inputSet.has(name)) return { kind: 'input' as const };
        if (Object.prototype.hasOwnProperty.call(constants, name)) return { kind: 'value' as const, value: constants[name] };
        return { kind: 'value' as const, value: libraryValue(name) as number };
      };
      const tree = prepareForDerivative(eq.expr, resolve, library, placeholders, inputsOf);
      if (countNodes(tree) > MAX_SYMBOLIC_NODES) throw new Error('too large');
      prepared.set(eq.target, tree);
      inputsOf = makeInputsOf(inputSet, placeholders);
    }
    full = prepared.get(measurand) ?? null;
  } catch {
    symbolicPossible = false;
  }

  const method: Array<'symbolic' | 'numeric'> = inputSymbols.map(() => 'numeric');
  let gradientSource: string | null = null;
  let gradient: ((x: ArrayLike<number>, out: number[]) => void) | null = null;
  if (symbolicPossible && full) {
    const depends = inputsOf(full);
    const behindPlaceholder = new Set<string>();
    for (const p of placeholders) for (const s of p.inputs) behindPlaceholder.add(s);
    const lines: string[] = [];
    const derivatives: Array<{ i: number; tree: MathNode }> = [];
    const symbolJs = (name: string): string => {
      const i = inputIndex.get(name);
      if (i !== undefined) return `a${i}`;
      const m = /^__(bp|bq|ba)(\d+)(?:_(\d))?$/.exec(name);
      if (m) return m[1] === 'bp' ? `p${m[2]}` : `${m[1] === 'bq' ? 'q' : 'A'}${m[2]}_${m[3]}`;
      throw new Error(`unresolved ${name}`);
    };
    inputSymbols.forEach((s, i) => {
      if (!depends.has(s)) {
        method[i] = 'symbolic'; // the measurand does not depend on it: ∂f/∂x = 0 exactly
        return;
      }
      if (behindPlaceholder.has(s)) return;
      try {
        const d = derivative(full as MathNode, s, { simplify: false });
        lines.push(`out[${i}] = ${generate(d, symbolJs)};`);
        derivatives.push({ i, tree: d });
        method[i] = 'symbolic';
      } catch {
        // mathjs has no rule for this function (min, max, abs at 0 …): central differences.
      }
    });
    const ph = placeholders
      .map((p, k) => {
        const [a0, a1, a2] = p.args.map((a) => generate(a, symbolJs));
        return `const A${k}_0 = ${a0}; const A${k}_1 = ${a1}; const A${k}_2 = ${a2};
  const p${k} = F_band_radiance(A${k}_0, A${k}_1, A${k}_2); const q${k}_0 = F_planck(A${k}_0, A${k}_2); const q${k}_1 = F_planck(A${k}_1, A${k}_2);`;
      })
      .join('\n  ');
    const reads = inputSymbols.map((_, i) => `const a${i} = x[${i}];`).join(' ');
    gradientSource = `"use strict";
${bindFunctions()}
return function gradient(x, out) {
  ${reads}
  ${ph}
  ${lines.join('\n  ')}
};`;
    try {
      gradient = makeFunction('F', gradientSource) as typeof gradient;
    } catch {
      gradient = codegen ? null : gradientFromClosures(derivatives, placeholders);
      if (!gradient) method.fill('numeric');
    }
  }

  function gradientFromClosures(derivs: Array<{ i: number; tree: MathNode }>, phs: Placeholder[]): (x: ArrayLike<number>, out: number[]) => void {
    const symbolOf = (name: string): NumberClosure => {
      const i = inputIndex.get(name);
      if (i !== undefined) return (e) => e.x[i];
      if (/^__(bp|bq|ba)\d+(?:_\d)?$/.test(name)) return (e) => e.named[name];
      throw new Error(`unresolved ${name}`);
    };
    const band = library.functions.band_radiance;
    const planck = library.functions.planck;
    const args = phs.map((p) => p.args.map((a) => closure(a, symbolOf, library.functions)));
    const outs = derivs.map(({ i, tree }) => ({ i, f: closure(tree, symbolOf, library.functions) }));
    return (x, out) => {
      const env: ClosureEnv = { x, v: [], named: {} };
      args.forEach(([a0, a1, a2], k) => {
        const A0 = a0(env), A1 = a1(env), A2 = a2(env);
        env.named[`__ba${k}_0`] = A0;
        env.named[`__ba${k}_1`] = A1;
        env.named[`__ba${k}_2`] = A2;
        env.named[`__bp${k}`] = band(A0, A1, A2);
        env.named[`__bq${k}_0`] = planck(A0, A2);
        env.named[`__bq${k}_1`] = planck(A1, A2);
      });
      for (const { i, f } of outs) out[i] = f(env);
    };
  }

  const central = (x: ArrayLike<number>, i: number, u: number | undefined): number => {
    const h = differenceStep(x[i], u);
    const xp = Array.from(x);
    const xm = Array.from(x);
    xp[i] += h;
    xm[i] -= h;
    const d = (built.measurand(xp) - built.measurand(xm)) / (xp[i] - xm[i]);
    if (!Number.isFinite(d)) {
      throw new EngineError('NON_FINITE', `the sensitivity coefficient of ${quantityName(inputSymbols[i])} is not finite: the model is not finite close to the estimate`, { path: ['inputs', i] });
    }
    return d;
  };

  const sensitivities = (x: ArrayLike<number>, scale?: ArrayLike<number>) => {
    const c = inputSymbols.map(() => 0);
    const m = [...method];
    if (gradient) gradient(x, c);
    inputSymbols.forEach((_, i) => {
      if (m[i] === 'symbolic' && Number.isFinite(c[i])) return;
      // Numeric by design, or the expanded closed form overflowed where the library does not.
      m[i] = 'numeric';
      c[i] = central(x, i, scale?.[i]);
    });
    return { c, method: m };
  };

  const secondOrder = (x: ArrayLike<number>, scale?: ArrayLike<number>) => {
    const n = inputSymbols.length;
    const g0 = sensitivities(x, scale).c;
    const hessian = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    const third = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    for (let j = 0; j < n; j++) {
      const h = differenceStep(x[j], scale?.[j], 4);
      const xp = Array.from(x);
      const xm = Array.from(x);
      xp[j] += h;
      xm[j] -= h;
      const hh = (xp[j] - xm[j]) / 2;
      const gp = sensitivities(xp, scale).c;
      const gm = sensitivities(xm, scale).c;
      for (let i = 0; i < n; i++) {
        hessian[i][j] = (gp[i] - gm[i]) / (2 * hh);
        third[i][j] = (gp[i] - 2 * g0[i] + gm[i]) / (hh * hh);
      }
    }
    for (let i = 0; i < n; i++)
      for (let j = 0; j < i; j++) {
        const s = (hessian[i][j] + hessian[j][i]) / 2;
        hessian[i][j] = s;
        hessian[j][i] = s;
      }
    return { hessian, third };
  };

  return {
    inputSymbols,
    measurand,
    equations,
    scalar,
    evaluateAll: (x) => built.all(x),
    kernel: built.kernel,
    sensitivities,
    hessian: (x) => secondOrder(x).hessian,
    secondOrder,
    source: { scalar: scalarSource, gradient: gradientSource },
  };
}
