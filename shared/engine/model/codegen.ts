/**
 * JavaScript source generation from an allow-listed mathjs tree.
 *
 * Why a hand-written generator: no library compiles a mathjs tree into a loop over typed
 * arrays, and evaluating the tree with mathjs once per Monte Carlo trial is about 30 times
 * slower than a plain JS function generated from the same tree (STACK-NOTES #9: 10^6
 * evaluations ≈ 270–470 ms with mathjs compile().evaluate, ≈ 12–50 ms generated). The generator
 * accepts only the node types the allow-list check admits (plus the few functions that
 * mathjs `derivative` introduces); any other node is a programming error and throws.
 */
import type { MathNode } from './math';
import { ELEMENTARY_FUNCTIONS, RADIOMETRIC_SIGNATURES } from './language';

type AnyNode = MathNode & Record<string, unknown>;

/** Functions that only appear in derivative trees produced by mathjs. */
const DERIVATIVE_ONLY: Readonly<Record<string, (a: string[]) => string>> = {
  sec: (a) => `(1 / Math.cos(${a[0]}))`,
  csc: (a) => `(1 / Math.sin(${a[0]}))`,
  cot: (a) => `(1 / Math.tan(${a[0]}))`,
  sign: (a) => `Math.sign(${a[0]})`,
};

/** JS source of a finite number literal, parenthesised so that signs and exponents compose. */
export function numberLiteral(v: number): string {
  if (!Number.isFinite(v)) throw new Error(`cannot generate code for the non-finite number ${v}`);
  if (Object.is(v, -0)) return '(-0)';
  return `(${String(v)})`;
}

/**
 * Generate a JS expression. `symbol(name)` returns the JS source for a symbol (a local name or a
 * literal); radiometric functions are referenced as `F_<name>`, locals bound once by the caller.
 */
export function generate(node: MathNode, symbol: (name: string) => string): string {
  const gen = (n: AnyNode): string => {
    switch (n.type) {
      case 'ConstantNode':
        if (typeof n.value !== 'number') throw new Error('only numeric constants can be compiled');
        return numberLiteral(n.value);
      case 'SymbolNode':
        return symbol(n.name as string);
      case 'ParenthesisNode':
        return `(${gen(n.content as AnyNode)})`;
      case 'OperatorNode': {
        const args = (n.args as AnyNode[]).map(gen);
        switch (n.fn) {
          case 'add': return `(${args[0]} + ${args[1]})`;
          case 'subtract': return `(${args[0]} - ${args[1]})`;
          case 'multiply': return `(${args[0]} * ${args[1]})`;
          case 'divide': return `(${args[0]} / ${args[1]})`;
          case 'pow': return `Math.pow(${args[0]}, ${args[1]})`;
          case 'unaryMinus': return `(-${args[0]})`;
          case 'unaryPlus': return `(+${args[0]})`;
          default: throw new Error(`operator ${String(n.fn)} cannot be compiled`);
        }
      }
      case 'FunctionNode': {
        const name = (n.fn as AnyNode).name as string;
        const args = (n.args as AnyNode[]).map(gen);
        if (Object.prototype.hasOwnProperty.call(ELEMENTARY_FUNCTIONS, name)) return `${ELEMENTARY_FUNCTIONS[name].js}(${args.join(', ')})`;
        if (Object.prototype.hasOwnProperty.call(RADIOMETRIC_SIGNATURES, name)) return `F_${name}(${args.join(', ')})`;
        if (Object.prototype.hasOwnProperty.call(DERIVATIVE_ONLY, name)) return DERIVATIVE_ONLY[name](args);
        throw new Error(`function ${name} cannot be compiled`);
      }
      default:
        throw new Error(`node ${n.type} cannot be compiled`);
    }
  };
  return gen(node as AnyNode);
}

/** Local bindings of the radiometric functions, taken once from the parameter `F`. */
export function bindFunctions(): string {
  return Object.keys(RADIOMETRIC_SIGNATURES).map((name) => `const F_${name} = F.${name};`).join('\n');
}
