/**
 * Preparation of a model for symbolic differentiation: intermediates substituted, constants
 * inlined as numbers and radiometric functions expanded into their closed elementary forms
 * (DESIGN.md formulas; SI constants except its90_ratio, which uses the ITS-90 c2). Band
 * radiance has no elementary closed form in T; see the band_radiance branch below.
 */
import { parse, ConstantNode, SymbolNode, ParenthesisNode, type MathNode } from './math';
import type { RadiometricLibrary } from './library-types';

type AnyNode = MathNode & Record<string, unknown>;

/** Closed forms; a0… are the arguments, the other names are radiation constants. */
const TEMPLATES: Readonly<Record<string, string>> = {
  // Planck's law per wavelength: L = c1L λ^-5 / (exp(c2/(λT)) − 1)
  planck: 'c1L / a0^5 / (exp(c2 / (a0 * a1)) - 1)',
  // Planck's law per frequency: L = (2hν³/c²) / (exp(hν/(kT)) − 1)
  planck_nu: '2 * h * a0^3 / c0^2 / (exp(h * a0 / (kB * a1)) - 1)',
  // inverse of planck in T: T = c2 / (λ ln(c1L/(λ^5 L) + 1))
  planck_temperature: 'c2 / (a0 * log(c1L / (a0^5 * a1) + 1))',
  stefan_boltzmann: 'sigma * a0^4',
  // λ_max = b / T, b taken from the library as wien_peak(1 K) · 1 K
  wien_peak: 'WIEN_B / a0',
  // Sakuma–Hattori: S = C / (exp(c2/(A T + B)) − 1) and its inverse T = c2/(A ln(C/S + 1)) − B/A
  sh_signal: 'a3 / (exp(c2 / (a1 * a0 + a2)) - 1)',
  sh_temperature: 'c2 / (a1 * log(a3 / a0 + 1)) - a2 / a1',
  // ITS-90: L(T)/L(TX) = (exp(c2/(λ TX)) − 1) / (exp(c2/(λ T)) − 1), c2 = 0.014388 m K
  its90_ratio: '(exp(c2_its90 / (a0 * a2)) - 1) / (exp(c2_its90 / (a0 * a1)) - 1)',
};

const BAND_TEMPLATE = parse('__bp + (__bq1 * __x1 - __bq0 * __x0) - (__bq1 * __ba1 - __bq0 * __ba0)');

const parsedTemplates = new Map<string, MathNode>();
function template(name: string): MathNode {
  let t = parsedTemplates.get(name);
  if (!t) {
    t = parse(TEMPLATES[name]);
    parsedTemplates.set(name, t);
  }
  return t;
}

/** Post-order rewrite; function names (the `fn` of a FunctionNode) are left alone. */
export function rewrite(node: MathNode, fn: (n: AnyNode) => MathNode): MathNode {
  const mapped = (node as AnyNode).map((child: MathNode, path: string) => (path === 'fn' ? child : rewrite(child, fn))) as AnyNode;
  return fn(mapped);
}

export function countNodes(node: MathNode): number {
  let n = 0;
  (node as AnyNode).traverse(() => {
    n += 1;
  });
  return n;
}

export interface Placeholder {
  name: string;
  /** Argument trees (already prepared; may refer to earlier placeholders). */
  args: MathNode[];
  /** Input symbols the temperature argument depends on (transitively): differentiated numerically. */
  inputs: Set<string>;
}

export interface Prepared {
  expr: MathNode;
  placeholders: Placeholder[];
}

/**
 * Substitute and expand. `values(name)` gives a number for constants (doc and library, already
 * resolved with precedence), `intermediate(name)` a prepared tree for an earlier intermediate,
 * and inputs are left as symbols.
 */
export function prepareForDerivative(
  expr: MathNode,
  resolve: (name: string) => { kind: 'input' } | { kind: 'value'; value: number } | { kind: 'tree'; tree: MathNode },
  library: RadiometricLibrary,
  placeholders: Placeholder[],
  inputsOf: (tree: MathNode) => Set<string>,
): MathNode {
  return rewrite(expr, (n) => {
    if (n.type === 'SymbolNode') {
      const r = resolve(n.name as string);
      if (r.kind === 'input') return n;
      if (r.kind === 'value') return new ConstantNode(r.value);
      return new ParenthesisNode(r.tree.cloneDeep());
    }
    if (n.type === 'FunctionNode') {
      const name = (n.fn as AnyNode).name as string;
      const args = n.args as MathNode[];
      if (name === 'band_radiance') {
        // B(λ1, λ2, T) = ∫ L_λ dλ from λ1 to λ2, so ∂B/∂λ1 = −L(λ1, T) and ∂B/∂λ2 = L(λ2, T)
        // (fundamental theorem of calculus). B is replaced by a tree whose value is B and whose
        // derivative in λ1, λ2 is exact: p + (q1·λ2 − q0·λ1) − (q1·A1 − q0·A0), where p = B,
        // q0 = L(A0, T), q1 = L(A1, T) and A0, A1 are the argument values, all computed at run
        // time and constant for differentiation. ∂B/∂T has no elementary form: inputs reaching
        // the T argument are differentiated by central differences of the whole model.
        const k = placeholders.length;
        const ph: Placeholder = { name: `__bp${k}`, args, inputs: inputsOf(args[2]) };
        placeholders.push(ph);
        return new ParenthesisNode(
          rewrite(BAND_TEMPLATE, (t) => {
            if (t.type !== 'SymbolNode') return t;
            const s = t.name as string;
            if (s === '__bp') return new SymbolNode(`__bp${k}`);
            const m = /^__(bq|ba|x)(\d)$/.exec(s);
            if (!m) return t;
            if (m[1] === 'x') return new ParenthesisNode(args[Number(m[2])].cloneDeep());
            return new SymbolNode(`__${m[1]}${k}_${m[2]}`);
          }),
        );
      }
      if (Object.prototype.hasOwnProperty.call(TEMPLATES, name)) {
        const consts: Record<string, number> = { ...library.constants, WIEN_B: library.functions.wien_peak(1) };
        return new ParenthesisNode(
          rewrite(template(name), (t) => {
            if (t.type !== 'SymbolNode') return t;
            const s = t.name as string;
            const m = /^a(\d)$/.exec(s);
            if (m) return new ParenthesisNode(args[Number(m[1])].cloneDeep());
            if (s in consts) return new ConstantNode(consts[s]);
            throw new Error(`template symbol ${s} has no value`);
          }),
        );
      }
    }
    return n;
  });
}

/** Input symbols in a prepared tree, including those behind placeholders. */
export function makeInputsOf(inputs: ReadonlySet<string>, placeholders: readonly Placeholder[]): (tree: MathNode) => Set<string> {
  return (tree) => {
    const out = new Set<string>();
    (tree as AnyNode).traverse((node: MathNode, path: string) => {
      const n = node as AnyNode;
      if (n.type !== 'SymbolNode' || path === 'fn') return;
      const name = n.name as string;
      if (inputs.has(name)) out.add(name);
      const ph = placeholders.find((p) => p.name === name);
      if (ph) for (const s of ph.inputs) out.add(s);
    });
    return out;
  };
}
