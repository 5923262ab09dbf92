/**
 * Dimensional check of a model from its inputs' units (template validation, DESIGN.md flow 1).
 *
 * Accepted unit syntax (mathjs unit syntax, SI Brochure symbols): unit symbols with SI prefixes
 * (K, mK, m, nm, um or µm, kg, g, mg, s, Hz, W, J, V, A, sr, rad …), products by a space or
 * `*`, quotients by `/`, powers by `^` with an integer exponent ("W m^-2 sr^-1 m^-1",
 * "W/(m^2 sr)", "K^-1", "m K"); "1" or an empty string for a dimensionless quantity; "°C" is
 * read as degC. Radian and steradian are treated as 1 (SI Brochure 9th ed., Table 4), so angles
 * and solid angles are dimensionless. Only dimensions are compared, not scales: "nm" and "m"
 * are both a length (the engine's numbers are taken as SI-consistent, DESIGN.md).
 *
 * Rules: the terms of + and −, and the arguments of min and max, have one dimension; the
 * arguments of exp, log, log10, sin, cos, tan, asin, acos, atan are dimensionless; an exponent
 * is dimensionless and, when the base has a dimension, a plain number; sqrt halves the
 * exponents. A number written in an equation adopts the dimension of what it is added to
 * (so `rho_a - 1.2` is accepted), and is dimensionless in a product. A symbol without a unit
 * (an input or constant with no unit given) makes the terms it touches unchecked, with a
 * warning. Radiometric functions have fixed SI argument and result dimensions.
 */
import type { BudgetDocument } from '../../schemas/budget.schema';
import type { EngineErrorCode } from '../errors';
import { checkEquations } from './check';
import { unit as mathUnit, type MathNode } from './math';
import { expressionText, quantityName } from './names';

type AnyNode = MathNode & Record<string, unknown>;

/** Exponents of kg, m, s, A, K, mol, cd (in this order). */
export type Dimension = number[];
const BASE = ['kg', 'm', 's', 'A', 'K', 'mol', 'cd'];
/** mathjs dimension index for each of BASE. */
const MATHJS_INDEX = [0, 1, 2, 3, 4, 6, 5];

type Dim = { kind: 'known'; d: Dimension } | { kind: 'free' } | { kind: 'unknown' };

const ZERO: Dimension = [0, 0, 0, 0, 0, 0, 0];
const dim = (...pairs: Array<[string, number]>): Dimension => {
  const d = [...ZERO];
  for (const [b, e] of pairs) d[BASE.indexOf(b)] += e;
  return d;
};
const known = (d: Dimension): Dim => ({ kind: 'known', d });

/** Format a dimension in SI base units, e.g. "kg m^-1 s^-3"; "1" when dimensionless. */
export function formatDimension(d: Dimension): string {
  const parts = BASE.map((b, i) => (d[i] === 0 ? '' : d[i] === 1 ? b : `${b}^${Number(d[i].toFixed(6))}`)).filter(Boolean);
  return parts.length ? parts.join(' ') : '1';
}

/** Parse a unit string into its dimension; throws Error with a readable message. */
export function parseUnitDimension(text: string): Dimension {
  const t = text.trim().replace(/[µμ]/g, 'u').replace(/°C/g, 'degC').replace(/°F/g, 'degF').replace(/·/g, ' ').replace(/−/g, '-');
  if (t === '' || t === '1') return [...ZERO];
  let u: unknown;
  try {
    u = mathUnit(t) as unknown;
  } catch (e) {
    throw new Error(`unit "${text}" is not understood (${(e as Error).message})`, { cause: e });
  }
  if ((u as { value: number | null }).value !== null) throw new Error(`unit "${text}" must not contain a number`);
  const dims = (u as { dimensions: number[] }).dimensions;
  return MATHJS_INDEX.map((k) => dims[k] ?? 0);
}

const same = (a: Dimension, b: Dimension) => a.every((v, i) => Math.abs(v - b[i]) < 1e-9);
const isZero = (a: Dimension) => a.every((v) => Math.abs(v) < 1e-9);

const M = dim(['m', 1]);
const K = dim(['K', 1]);
/** Argument and result dimensions of the radiometric library (SI). */
const RADIOMETRIC: Record<string, { args: Array<Dimension | 'C'>; result: Dimension | 'C' }> = {
  // W m^-2 sr^-1 m^-1 = kg m^-1 s^-3
  planck: { args: [M, K], result: dim(['kg', 1], ['m', -1], ['s', -3]) },
  // W m^-2 sr^-1 Hz^-1 = kg s^-2
  planck_nu: { args: [dim(['s', -1]), K], result: dim(['kg', 1], ['s', -2]) },
  planck_temperature: { args: [M, dim(['kg', 1], ['m', -1], ['s', -3])], result: K },
  // W m^-2 sr^-1 = kg s^-3
  band_radiance: { args: [M, M, K], result: dim(['kg', 1], ['s', -3]) },
  // W m^-2 = kg s^-3
  stefan_boltzmann: { args: [K], result: dim(['kg', 1], ['s', -3]) },
  wien_peak: { args: [K], result: M },
  // S = C/(exp(c2/(A T + B)) − 1): A a length, B a length × temperature; S has the unit of C.
  sh_signal: { args: [K, M, dim(['m', 1], ['K', 1]), 'C'], result: 'C' },
  sh_temperature: { args: ['C', M, dim(['m', 1], ['K', 1]), 'C'], result: K },
  its90_ratio: { args: [M, K, K], result: ZERO },
};
const LIBRARY_CONSTANT_DIMS: Record<string, Dimension> = {
  c1L: dim(['kg', 1], ['m', 4], ['s', -3]), // W m² sr⁻¹
  c2: dim(['m', 1], ['K', 1]),
  c2_its90: dim(['m', 1], ['K', 1]),
  sigma: dim(['kg', 1], ['s', -3], ['K', -4]), // W m⁻² K⁻⁴
  h: dim(['kg', 1], ['m', 2], ['s', -1]), // J s
  c0: dim(['m', 1], ['s', -1]),
  kB: dim(['kg', 1], ['m', 2], ['s', -2], ['K', -1]), // J K⁻¹
  pi: ZERO,
};
const DIMENSIONLESS_ARG = new Set(['exp', 'log', 'log10', 'sin', 'cos', 'tan', 'asin', 'acos', 'atan']);

export interface UnitIssue {
  equation?: number;
  path?: Array<string | number>;
  message: string;
  code: EngineErrorCode;
}

export interface UnitCheckResult {
  ok: boolean;
  /** The measurand's derived dimension in SI base units, null when it could not be derived. */
  dimension: string | null;
  errors: UnitIssue[];
  warnings: string[];
}

function constValue(n: AnyNode): number | null {
  switch (n.type) {
    case 'ConstantNode':
      return typeof n.value === 'number' ? n.value : null;
    case 'ParenthesisNode':
      return constValue(n.content as AnyNode);
    case 'OperatorNode': {
      const a = (n.args as AnyNode[]).map(constValue);
      if (a.some((v) => v === null)) return null;
      const [p, q] = a as number[];
      switch (n.fn) {
        case 'unaryMinus': return -p;
        case 'unaryPlus': return p;
        case 'add': return p + q;
        case 'subtract': return p - q;
        case 'multiply': return p * q;
        case 'divide': return p / q;
        case 'pow': return p ** q;
        default: return null;
      }
    }
    default:
      return null;
  }
}

/** Check the model's dimensions. Never throws on bad input: problems are listed in `errors`. */
export function checkUnits(doc: BudgetDocument): UnitCheckResult {
  const errors: UnitIssue[] = [];
  const warnings: string[] = [];
  const symbols = new Map<string, Dim>();
  const shown = new Map<string, string>();
  for (const [name, d] of Object.entries(LIBRARY_CONSTANT_DIMS)) symbols.set(name, known(d));

  const declare = (name: string, unitText: string | undefined, path: Array<string | number>, what: string) => {
    if (unitText === undefined) {
      symbols.set(name, { kind: 'unknown' });
      warnings.push(`${what} ${quantityName(name)} has no unit: terms involving it are not checked`);
      return;
    }
    try {
      symbols.set(name, known(parseUnitDimension(unitText)));
      shown.set(name, unitText.trim() === '' ? '1' : unitText);
    } catch (e) {
      symbols.set(name, { kind: 'unknown' });
      errors.push({ path, code: 'UNIT_MISMATCH', message: `${what} ${quantityName(name)}: ${(e as Error).message}` });
    }
  };
  const constantUnits = (doc as { constantUnits?: Record<string, string> }).constantUnits ?? {};
  for (const name of Object.keys(doc.constants ?? {})) declare(name, constantUnits[name], ['constantUnits', name], 'constant');
  doc.inputs.forEach((input, i) => declare(input.symbol, input.unit, ['inputs', i, 'unit'], 'input'));

  const checked = checkEquations(doc.equations, [...doc.inputs.map((i) => i.symbol), ...Object.keys(doc.constants ?? {})]);
  for (const e of checked.errors) errors.push({ equation: e.equation, path: ['equations', e.equation], code: e.code, message: e.message });
  if (!checked.ok) return { ok: false, dimension: null, errors, warnings };

  const show = (d: Dim) => (d.kind === 'known' ? formatDimension(d.d) : d.kind === 'free' ? 'a plain number' : 'no unit');
  const term = (n: AnyNode) => {
    const text = expressionText(n);
    const s = n.type === 'SymbolNode' && shown.has(n.name as string) ? `${text} [${shown.get(n.name as string)}]` : text;
    return s.length > 60 ? `${s.slice(0, 57)}...` : s;
  };

  for (const eq of checked.checked) {
    const where = `equation ${eq.index + 1}`;
    const fail = (message: string) => errors.push({ equation: eq.index, path: ['equations', eq.index], code: 'UNIT_MISMATCH', message: `${where}: ${message}` });
    const same3 = (nodes: AnyNode[], dims: Dim[], what: string): Dim => {
      if (dims.some((d) => d.kind === 'unknown')) return { kind: 'unknown' };
      const knowns = dims.map((d, i) => [d, i] as const).filter(([d]) => d.kind === 'known') as Array<readonly [{ kind: 'known'; d: Dimension }, number]>;
      if (knowns.length === 0) return { kind: 'free' };
      const [first, fi] = knowns[0];
      for (const [d, i] of knowns.slice(1)) {
        if (!same(d.d, first.d)) {
          fail(`${what} mixes different dimensions: "${term(nodes[fi])}" is ${formatDimension(first.d)} but "${term(nodes[i])}" is ${formatDimension(d.d)}`);
          return { kind: 'unknown' };
        }
      }
      return first;
    };
    const visit = (n: AnyNode): Dim => {
      switch (n.type) {
        case 'ConstantNode':
          return { kind: 'free' };
        case 'SymbolNode': {
          const d = symbols.get(n.name as string);
          return d ?? { kind: 'unknown' };
        }
        case 'ParenthesisNode':
          return visit(n.content as AnyNode);
        case 'OperatorNode': {
          const args = n.args as AnyNode[];
          const d = args.map(visit);
          switch (n.fn) {
            case 'unaryMinus':
            case 'unaryPlus':
              return d[0];
            case 'add':
            case 'subtract':
              return same3(args, d, `"${n.op}" in "${term(n)}"`);
            case 'multiply':
            case 'divide': {
              if (d.some((x) => x.kind === 'unknown')) return { kind: 'unknown' };
              if (d.every((x) => x.kind === 'free')) return { kind: 'free' };
              const a = d[0].kind === 'known' ? d[0].d : ZERO;
              const b = d[1].kind === 'known' ? d[1].d : ZERO;
              return known(a.map((v, i) => (n.fn === 'multiply' ? v + b[i] : v - b[i])));
            }
            case 'pow': {
              const [base, exponent] = d;
              if (exponent.kind === 'known' && !isZero(exponent.d)) {
                fail(`the exponent "${term(args[1])}" must be dimensionless but is ${formatDimension(exponent.d)}`);
                return { kind: 'unknown' };
              }
              if (base.kind !== 'known' || isZero(base.d)) return base;
              const p = constValue(args[1]);
              if (p === null) {
                fail(`"${term(args[0])}" has the dimension ${formatDimension(base.d)}, so its exponent must be a plain number, not "${term(args[1])}"`);
                return { kind: 'unknown' };
              }
              return known(base.d.map((v) => v * p));
            }
            default:
              return { kind: 'unknown' };
          }
        }
        case 'FunctionNode': {
          const name = (n.fn as AnyNode).name as string;
          const args = n.args as AnyNode[];
          const d = args.map(visit);
          if (DIMENSIONLESS_ARG.has(name)) {
            if (d[0].kind === 'known' && !isZero(d[0].d)) fail(`the argument of ${name}, "${term(args[0])}", must be dimensionless but is ${formatDimension(d[0].d)}`);
            return known([...ZERO]);
          }
          if (name === 'sqrt') return d[0].kind === 'known' ? known(d[0].d.map((v) => v / 2)) : d[0];
          if (name === 'abs') return d[0];
          if (name === 'min' || name === 'max') return same3(args, d, `${name}(…)`);
          const sig = RADIOMETRIC[name];
          if (!sig) return { kind: 'unknown' };
          let cDim: Dim = { kind: 'unknown' };
          sig.args.forEach((expected, i) => {
            if (expected === 'C') {
              if (cDim.kind === 'known' && d[i].kind === 'known' && !same(cDim.d, (d[i] as { d: Dimension }).d)) {
                fail(`${name}: "${term(args[i])}" is ${show(d[i])} but the signal arguments must share one unit (${show(cDim)})`);
              }
              if (cDim.kind !== 'known') cDim = d[i].kind === 'free' ? known([...ZERO]) : d[i];
              return;
            }
            if (d[i].kind === 'known' && !same((d[i] as { d: Dimension }).d, expected)) {
              fail(`${name}: argument ${i + 1}, "${term(args[i])}", must be ${formatDimension(expected)} but is ${show(d[i])}`);
            }
          });
          return sig.result === 'C' ? cDim : known(sig.result);
        }
        default:
          return { kind: 'unknown' };
      }
    };
    const result = visit(eq.expr as AnyNode);
    symbols.set(eq.target, result.kind === 'free' ? known([...ZERO]) : result);
  }

  const measurand = doc.measurand?.symbol ?? checked.defines[checked.defines.length - 1];
  const md = symbols.get(measurand);
  let dimension: string | null = null;
  if (md?.kind === 'known') {
    dimension = formatDimension(md.d);
    const declared = doc.measurand?.unit;
    if (declared !== undefined) {
      try {
        const dd = parseUnitDimension(declared);
        if (!same(dd, md.d)) {
          const eqIndex = checked.defines.lastIndexOf(measurand);
          errors.push({ equation: eqIndex, path: ['measurand', 'unit'], code: 'UNIT_MISMATCH', message: `the model gives the measurand ${quantityName(measurand)} in ${dimension}, but its unit "${declared}" is ${formatDimension(dd)}` });
        }
      } catch (e) {
        errors.push({ path: ['measurand', 'unit'], code: 'UNIT_MISMATCH', message: `measurand ${quantityName(measurand)}: ${(e as Error).message}` });
      }
    }
  } else if (md && errors.length === 0) warnings.push(`the measurand's dimension could not be derived (some symbols have no unit)`);
  return { ok: errors.length === 0, dimension, errors, warnings };
}
