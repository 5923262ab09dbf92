/**
 * The same allow-listed tree as ./codegen.ts, turned into nested JavaScript closures instead of
 * generated source. Used where `new Function` is unavailable — a browser page whose
 * Content-Security-Policy has no 'unsafe-eval' (the app's own policy) — so the live GUM budget
 * runs there with the same arithmetic, in the same order, as the generated code. It is slower
 * than generated code per evaluation, which does not matter for the GUM (a few hundred
 * evaluations); Monte Carlo runs on the server, where the generated kernel is used.
 */
import type { MathNode } from './math';
import { ELEMENTARY_FUNCTIONS, RADIOMETRIC_SIGNATURES } from './language';

/** Values a closure reads: inputs `x`, equation values `v`, named extras (derivative placeholders). */
export interface ClosureEnv {
  x: ArrayLike<number>;
  v: number[];
  named: Record<string, number>;
}
export type NumberClosure = (env: ClosureEnv) => number;

type AnyNode = MathNode & Record<string, unknown>;
type Fn = (...a: number[]) => number;

const MATH_FUNCTIONS: Readonly<Record<string, Fn>> = {
  'Math.exp': Math.exp, 'Math.log': Math.log, 'Math.log10': Math.log10, 'Math.sqrt': Math.sqrt,
  'Math.abs': Math.abs, 'Math.sin': Math.sin, 'Math.cos': Math.cos, 'Math.tan': Math.tan,
  'Math.asin': Math.asin, 'Math.acos': Math.acos, 'Math.atan': Math.atan, 'Math.min': Math.min, 'Math.max': Math.max,
};

/** The functions mathjs `derivative` introduces (as in ./codegen.ts). */
const DERIVATIVE_ONLY: Readonly<Record<string, Fn>> = {
  sec: (a) => 1 / Math.cos(a),
  csc: (a) => 1 / Math.sin(a),
  cot: (a) => 1 / Math.tan(a),
  sign: (a) => Math.sign(a),
};

const has = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);

/**
 * Build a closure for `node`. `symbol(name)` returns the closure reading that symbol;
 * `library` holds the radiometric functions by name.
 */
export function closure(node: MathNode, symbol: (name: string) => NumberClosure, library: Readonly<Record<string, Fn>>): NumberClosure {
  const build = (n: AnyNode): NumberClosure => {
    switch (n.type) {
      case 'ConstantNode': {
        if (typeof n.value !== 'number' || !Number.isFinite(n.value)) throw new Error('only finite numeric constants can be compiled');
        const c = n.value;
        return () => c;
      }
      case 'SymbolNode':
        return symbol(n.name as string);
      case 'ParenthesisNode':
        return build(n.content as AnyNode);
      case 'OperatorNode': {
        const [a, b] = (n.args as AnyNode[]).map(build);
        switch (n.fn) {
          case 'add': return (e) => a(e) + b(e);
          case 'subtract': return (e) => a(e) - b(e);
          case 'multiply': return (e) => a(e) * b(e);
          case 'divide': return (e) => a(e) / b(e);
          case 'pow': return (e) => Math.pow(a(e), b(e));
          case 'unaryMinus': return (e) => -a(e);
          case 'unaryPlus': return (e) => +a(e);
          default: throw new Error(`operator ${String(n.fn)} cannot be compiled`);
        }
      }
      case 'FunctionNode': {
        const name = (n.fn as AnyNode).name as string;
        const args = (n.args as AnyNode[]).map(build);
        let f: Fn;
        if (has(ELEMENTARY_FUNCTIONS, name)) f = MATH_FUNCTIONS[ELEMENTARY_FUNCTIONS[name].js];
        else if (has(RADIOMETRIC_SIGNATURES, name) && has(library, name)) f = library[name];
        else if (has(DERIVATIVE_ONLY, name)) f = DERIVATIVE_ONLY[name];
        else throw new Error(`function ${name} cannot be compiled`);
        if (args.length === 1) {
          const [a] = args;
          return (e) => f(a(e));
        }
        if (args.length === 2) {
          const [a, b] = args;
          return (e) => f(a(e), b(e));
        }
        return (e) => f(...args.map((a) => a(e)));
      }
      default:
        throw new Error(`node ${n.type} cannot be compiled`);
    }
  };
  return build(node as AnyNode);
}

/** True when `e` is what a runtime throws for `new Function` under a policy that forbids it. */
export function isCodeGenerationRefused(e: unknown): boolean {
  return e instanceof EvalError || /unsafe-eval|Content Security Policy|code generation/i.test(String((e as Error)?.message ?? e));
}
