/**
 * A model equation as a metrologist writes it, in pieces for the certificate to typeset: each
 * identifier as the budget rows type it (shared/format/symbols.ts: italic quantity symbol, Greek
 * where the name spells a letter, its subscript; ISO 80000-1 §7.1), numbers through
 * shared/format, operators, brackets and function names upright (ISO 80000-2:2019), powers as
 * superscripts. The equation is read with mathjs's parser, as the engine reads it
 * (shared/engine/model/check.ts); nothing is evaluated.
 *
 * Line breaks: the space after "=", "+", "−" and "·" is an ordinary one, every other space is
 * U+00A0 NO-BREAK SPACE, so a long right side breaks after an operator (the operator ends the
 * line), never inside a symbol, a number or a function's argument list.
 */
import { parse, type MathNode } from 'mathjs';
import { formatNumber, subscriptUpright, symbolText } from '../../shared/format';

const NBSP = '\u00A0';
const MINUS = '\u2212';
const DOT = '\u00B7';

export type EquationPiece =
  /** A quantity symbol: base italic unless `upright` (π), subscript lowered. */
  | { kind: 'symbol'; base: string; sub: string | null; subUpright: boolean; upright?: boolean }
  /** Upright text: operators, brackets, numbers, function names. */
  | { kind: 'text'; text: string }
  /** An exponent, raised. */
  | { kind: 'sup'; pieces: EquationPiece[] };

export type SymbolPiece = Extract<EquationPiece, { kind: 'symbol' }>;

export interface TypesetEquation {
  /** The symbol the equation defines, then " = ". */
  left: [SymbolPiece, ...EquationPiece[]];
  right: EquationPiece[];
}

/**
 * The library constants (shared/engine/model/language.ts LIBRARY_CONSTANT_NAMES) with their
 * conventional symbols, as the template editor typesets them
 * (src/features/templates/components/symbol-tex.ts). π is upright, a mathematical constant
 * (ISO 80000-2:2019); the others are physical constants, italic quantity symbols.
 */
const LIBRARY_CONSTANTS: Readonly<Record<string, SymbolPiece>> = {
  c1L: { kind: 'symbol', base: 'c', sub: '1L', subUpright: true },
  c2: { kind: 'symbol', base: 'c', sub: '2', subUpright: true },
  c2_its90: { kind: 'symbol', base: 'c', sub: '2,ITS-90', subUpright: true },
  sigma: { kind: 'symbol', base: 'σ', sub: null, subUpright: true },
  h: { kind: 'symbol', base: 'h', sub: null, subUpright: true },
  c0: { kind: 'symbol', base: 'c', sub: '0', subUpright: true },
  kB: { kind: 'symbol', base: 'k', sub: 'B', subUpright: true },
  pi: { kind: 'symbol', base: 'π', sub: null, subUpright: true, upright: true },
};

/**
 * Function names as printed: ln for the natural logarithm (the model language's log) and lg for
 * the decimal one, arcsin… for the inverse functions (ISO 80000-2:2019). Others as written.
 */
const FUNCTION_NAMES: Readonly<Record<string, string>> = { log: 'ln', log10: 'lg', asin: 'arcsin', acos: 'arccos', atan: 'arctan' };

/** An identifier as the budget rows type it (the certificate's Sym, shared/format/symbols.ts). */
export function symbolPiece(name: string): SymbolPiece {
  const { base, sub } = symbolText(name);
  return { kind: 'symbol', base, sub, subUpright: sub === null || subscriptUpright(sub) };
}

type Node = MathNode & { type: string; name?: string; value?: unknown; fn?: string | { name?: string }; args?: Node[]; content?: Node; object?: Node; index?: unknown };

class Unprintable extends Error {}

const text = (t: string): EquationPiece => ({ kind: 'text', text: t });
/** A binary operator that a line may end with: no break before it, one after it. */
const operator = (op: string): EquationPiece => text(`${NBSP}${op} `);

const isSimple = (n: Node) => n.type === 'SymbolNode' || n.type === 'ConstantNode';
const isQuotient = (n: Node) => n.type === 'OperatorNode' && n.fn === 'divide';

type Equation = Node & { object: Node & { name: string }; value: Node };

/** The parsed "symbol = expression", or null when the text is not one. */
function readEquation(equation: string): Equation | null {
  let root: Node;
  try {
    // Text written for print ("a − b · c") reads as the model language's ASCII operators.
    root = parse(equation.replace(/\u2212/g, '-').replace(/[\u00B7\u22C5\u00D7]/g, '*')) as Node;
  } catch {
    return null;
  }
  if (root.type !== 'AssignmentNode' || root.object?.type !== 'SymbolNode' || root.index || !root.value) return null;
  return root as Equation;
}

/**
 * The model's equations, each as the pieces of its two sides, or null for one that is not
 * "symbol = expression" in the model language (the certificate prints that one as written).
 * An input or an intermediate (the left side of an equation) named like a library constant is
 * that quantity, not the constant, as in the engine.
 */
export function typesetModel(equations: readonly string[], inputs: Iterable<string> = []): Array<TypesetEquation | null> {
  const read = equations.map(readEquation);
  const shadowing = new Set([...inputs, ...read.flatMap((r) => (r ? [r.object.name] : []))]);
  return read.map((r) => r && printEquation(r, shadowing));
}

/** One equation ("T_bb = T_ref + dT_unif"); `shadowing` as for {@link typesetModel}. */
export function typesetEquation(equation: string, shadowing: ReadonlySet<string> = new Set()): TypesetEquation | null {
  const root = readEquation(equation);
  return root && printEquation(root, shadowing);
}

function printEquation(root: Equation, shadowing: ReadonlySet<string>): TypesetEquation | null {
  const identifier = (name: string): SymbolPiece =>
    !shadowing.has(name) && Object.prototype.hasOwnProperty.call(LIBRARY_CONSTANTS, name) ? LIBRARY_CONSTANTS[name] : symbolPiece(name);

  const print = (n: Node): EquationPiece[] => {
    switch (n.type) {
      case 'SymbolNode':
        return [identifier(n.name!)];
      case 'ConstantNode':
        if (typeof n.value !== 'number') throw new Unprintable();
        // "1.5 × 10⁻³" stays on one line.
        return [text(formatNumber(n.value).replace(/ /g, NBSP))];
      case 'ParenthesisNode':
        return [text('('), ...print(n.content!), text(')')];
      case 'FunctionNode':
        return printCall(n);
      case 'OperatorNode':
        return printOperator(n);
      default:
        throw new Unprintable();
    }
  };

  const printCall = (n: Node): EquationPiece[] => {
    const name = typeof n.fn === 'object' ? n.fn?.name : undefined;
    const args = n.args ?? [];
    if (!name) throw new Unprintable();
    if (name === 'sqrt' && args.length === 1) return isSimple(args[0]) ? [text('√'), ...print(args[0])] : [text('√('), ...print(args[0]), text(')')];
    if (name === 'abs' && args.length === 1) return [text('|'), ...print(args[0]), text('|')];
    const list = args.flatMap((a, i) => (i === 0 ? print(a) : [text(`,${NBSP}`), ...print(a)]));
    return [text(`${FUNCTION_NAMES[name] ?? name}(`), ...list, text(')')];
  };

  const printOperator = (n: Node): EquationPiece[] => {
    const [a, b] = n.args ?? [];
    switch (n.fn) {
      case 'unaryMinus':
        return [text(MINUS), ...print(a)];
      case 'unaryPlus':
        return [text('+'), ...print(a)];
      case 'add':
        return [...print(a), operator('+'), ...print(b)];
      case 'subtract':
        return [...print(a), operator(MINUS), ...print(b)];
      case 'multiply':
        return [...grouped(a), operator(DOT), ...print(b)];
      case 'divide':
        return [...grouped(a), text('/'), ...print(b)];
      case 'pow': {
        // The raised exponent groups itself: x^(a+b) is x with a + b raised, without brackets.
        const exponent = b.type === 'ParenthesisNode' ? b.content! : b;
        const base = print(a);
        const wrap = a.type === 'ConstantNode' && base.some((p) => p.kind === 'text' && p.text.includes('×'));
        return [...(wrap ? [text('('), ...base, text(')')] : base), { kind: 'sup', pieces: print(exponent) }];
      }
      default:
        throw new Unprintable();
    }
  };

  /** A quotient before · or / is bracketed: a/b · c and a/b/c would read two ways. Common practice, no source. */
  const grouped = (n: Node): EquationPiece[] => (isQuotient(n) ? [text('('), ...print(n), text(')')] : print(n));

  try {
    return { left: [identifier(root.object.name), text(`${NBSP}= `)], right: merge(print(root.value)) };
  } catch (e) {
    if (e instanceof Unprintable) return null;
    throw e;
  }
}

/** Joins neighbouring upright texts into one piece (fewer runs for the layout). */
function merge(pieces: EquationPiece[]): EquationPiece[] {
  const out: EquationPiece[] = [];
  for (const p of pieces) {
    const last = out[out.length - 1];
    if (p.kind === 'text' && last?.kind === 'text') out[out.length - 1] = text(last.text + p.text);
    else out.push(p.kind === 'sup' ? { kind: 'sup', pieces: merge(p.pieces) } : p);
  }
  return out;
}

/** The pieces as one line of plain text ("T_bb = T_ref + δT_unif"), for tests and messages. */
export function equationPlain(pieces: readonly EquationPiece[]): string {
  return pieces
    .map((p) => {
      if (p.kind === 'text') return p.text;
      if (p.kind === 'sup') return `^(${equationPlain(p.pieces)})`;
      return p.sub === null ? p.base : `${p.base}_${p.sub}`;
    })
    .join('')
    .replace(/\u00A0/g, ' ');
}
