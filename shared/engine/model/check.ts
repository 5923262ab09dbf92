/**
 * The allow-list check of the model language (DESIGN.md, "The model language"). Every equation
 * is `symbol = expression`; the expression may contain only numbers, known symbols, the
 * operators + - * / ^ (and unary minus/plus), parentheses and the listed functions. Anything
 * else is refused with a message naming it and the character position where it starts.
 *
 * Runs in the browser too (the template editor shows live errors): no node: imports.
 */
import type { EngineErrorCode } from '../errors';
import { parse, type MathNode } from './math';
import { tokenize, isCall, endsValue, type Token } from './tokens';
import { quantityName } from './names';
import { ALL_FUNCTION_NAMES, LIBRARY_CONSTANT_NAMES, RADIOMETRIC_SIGNATURES, arityOf, isAllowedFunction } from './language';

/** Longest accepted equation text, in characters (the budget schema has the same bound). */
export const MAX_EXPRESSION_LENGTH = 10_000;
/** Deepest accepted bracket nesting, checked before mathjs parses (its parser is recursive). */
export const MAX_NESTING = 64;
/** Deepest accepted parsed tree (long chains such as - - - x also nest). */
export const MAX_TREE_DEPTH = 200;

export interface EquationIssue {
  /** 0-based index into the equations. */
  equation: number;
  /** 0-based character index in that equation where the problem starts. */
  position: number;
  /** Length of the offending text (at least 1). */
  length: number;
  message: string;
  code: EngineErrorCode;
}

export interface CheckedEquation {
  index: number;
  text: string;
  /** The symbol the equation defines (its left side). */
  target: string;
  /** The right side, allow-listed. */
  expr: MathNode;
  /** Distinct symbols the right side uses. */
  symbols: string[];
}

const ALLOWED_OPERATORS = new Set(['add', 'subtract', 'multiply', 'divide', 'pow', 'unaryMinus', 'unaryPlus']);

type AnyNode = MathNode & Record<string, unknown>;

/** Guards that run on the raw text before mathjs sees it. */
export function checkExpressionText(text: string, equation: number): EquationIssue | null {
  if (text.length > MAX_EXPRESSION_LENGTH) {
    return { equation, position: MAX_EXPRESSION_LENGTH, length: 1, code: 'TOO_LARGE', message: `equation ${equation + 1} is ${text.length} characters long; at most ${MAX_EXPRESSION_LENGTH} are accepted` };
  }
  let depth = 0;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === '(' || ch === '[' || ch === '{') {
      depth += 1;
      if (depth > MAX_NESTING) return { equation, position: i, length: 1, code: 'TOO_LARGE', message: `equation ${equation + 1} nests brackets more than ${MAX_NESTING} deep` };
    } else if (ch === ')' || ch === ']' || ch === '}') depth -= 1;
  }
  return null;
}

/** Left-hand symbols of equations written `name = …` (a quick scan; the full check is below). */
export function scanTargets(equations: readonly string[]): Map<string, number> {
  const targets = new Map<string, number>();
  equations.forEach((text, i) => {
    const m = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*=(?!=)/.exec(text);
    if (m && !targets.has(m[1])) targets.set(m[1], i);
  });
  return targets;
}

class Locator {
  tokens: Token[];
  constructor(readonly text: string) {
    this.tokens = tokenize(text);
  }
  /** Search only after the first "=" from now on (the right side of `symbol = expression`). */
  rightSide(): void {
    const i = this.tokens.findIndex((t) => t.text === '=');
    if (i >= 0) this.tokens = this.tokens.slice(i + 1);
  }
  /** First name token `name`; `call` true: followed by "(", false: not followed, undefined: either. */
  name(name: string, call?: boolean): { position: number; length: number } {
    const i = this.tokens.findIndex((t, k) => t.kind === 'name' && t.text === name && (call === undefined || isCall(this.tokens, k) === call));
    return this.at(i, name.length);
  }
  op(op: string, skip = 0): { position: number; length: number } {
    let seen = 0;
    const i = this.tokens.findIndex((t) => (t.kind === 'op' || t.kind === 'name') && t.text.toLowerCase() === op.toLowerCase() && seen++ >= skip);
    return this.at(i, op.length);
  }
  kind(kind: Token['kind']): { position: number; length: number } {
    const i = this.tokens.findIndex((t) => t.kind === kind);
    return this.at(i, this.tokens[i]?.text.length ?? 1);
  }
  /** An opening "[" that follows a value (indexing) or not (a matrix). */
  bracket(indexing: boolean): { position: number; length: number } {
    const i = this.tokens.findIndex((t, k) => t.text === '[' && endsValue(this.tokens[k - 1]) === indexing);
    return this.at(i, 1);
  }
  /** A "." used for property access (a name follows it). */
  dot(): { position: number; length: number } {
    const i = this.tokens.findIndex((t, k) => t.text === '.' && this.tokens[k + 1]?.kind === 'name');
    return this.at(i, 1);
  }
  /** Two values side by side with no operator between (implicit multiplication). */
  implicit(): { position: number; length: number } {
    for (let k = 1; k < this.tokens.length; k++) {
      const a = this.tokens[k - 1];
      const b = this.tokens[k];
      if (endsValue(a) && !isCall(this.tokens, k - 1) && (b.kind === 'number' || b.kind === 'name' || b.text === '(')) return { position: b.pos, length: b.text.length };
    }
    return { position: 0, length: 1 };
  }
  private at(i: number, length: number): { position: number; length: number } {
    const t = this.tokens[i];
    return t ? { position: t.pos, length: Math.max(1, length) } : { position: 0, length: 1 };
  }
}

function describe(node: AnyNode): string {
  try {
    const s = node.toString();
    return s.length > 40 ? `${s.slice(0, 37)}...` : s;
  } catch {
    return node.type;
  }
}

/**
 * Check one equation. `known` holds every symbol the right side may use (inputs, constants,
 * earlier intermediates; library constants are added here). `laterTargets` names symbols that
 * later equations define, for a clearer message.
 */
export function checkEquation(
  text: string,
  equation: number,
  known: ReadonlySet<string>,
  laterTargets: ReadonlyMap<string, number> = new Map(),
): { checked?: CheckedEquation; issues: EquationIssue[] } {
  const guard = checkExpressionText(text, equation);
  if (guard) return { issues: [guard] };
  const loc = new Locator(text);
  const issues: EquationIssue[] = [];
  const issue = (code: EngineErrorCode, message: string, where: { position: number; length: number }) => {
    if (!issues.some((x) => x.position === where.position && x.message === message)) issues.push({ equation, code, message, ...where });
  };
  const eqName = `equation ${equation + 1}`;

  let root: AnyNode;
  try {
    root = parse(text) as AnyNode;
  } catch (e) {
    if (e instanceof RangeError) return { issues: [{ equation, position: 0, length: 1, code: 'TOO_LARGE', message: `${eqName} nests too deeply to be read` }] };
    const err = e as Error & { char?: number };
    const position = typeof err.char === 'number' ? Math.max(0, Math.min(err.char, Math.max(0, text.length - 1))) : 0;
    const message = (err.message ?? String(e)).replace(/\s*\(char \d+\)\s*$/, '');
    return { issues: [{ equation, position, length: 1, code: 'PARSE_ERROR', message: `${eqName} cannot be read: ${message}` }] };
  }

  if (root.type === 'BlockNode') {
    const where = loc.op(text.includes(';') ? ';' : '\n');
    return { issues: [{ equation, code: 'FORBIDDEN_SYNTAX', message: `${eqName} holds more than one statement; write one equation per entry`, ...where }] };
  }
  if (root.type === 'FunctionAssignmentNode') {
    return { issues: [{ equation, code: 'FORBIDDEN_SYNTAX', message: `${eqName}: function definitions are not allowed; write "symbol = expression"`, ...loc.op('=') }] };
  }
  if (root.type !== 'AssignmentNode') {
    return { issues: [{ equation, position: 0, length: Math.max(1, text.trim().length), code: 'FORBIDDEN_SYNTAX', message: `${eqName} must have the form "symbol = expression"` }] };
  }
  const object = root.object as AnyNode;
  if (object.type !== 'SymbolNode' || root.index) {
    return { issues: [{ equation, position: 0, length: 1, code: 'FORBIDDEN_SYNTAX', message: `${eqName}: the left side must be a single symbol, not "${describe(object)}${root.index ? '[…]' : ''}"` }] };
  }
  const target = object.name as string;
  if (!/^[A-Za-z][A-Za-z0-9_]*$/.test(target)) {
    issue('FORBIDDEN_SYNTAX', `${eqName}: "${target}" is not a valid symbol (a letter, then letters, digits or _)`, loc.name(target));
  }
  const expr = root.value as AnyNode;
  loc.rightSide();
  const symbols = new Set<string>();
  const libraryConstants = new Set<string>(LIBRARY_CONSTANT_NAMES);

  const visit = (node: AnyNode, depth: number): void => {
    if (depth > MAX_TREE_DEPTH) {
      issue('TOO_LARGE', `${eqName} nests more than ${MAX_TREE_DEPTH} operations deep`, { position: 0, length: 1 });
      return;
    }
    switch (node.type) {
      case 'ConstantNode': {
        const v = node.value;
        if (typeof v === 'number') {
          // "Infinity", "NaN" and literals beyond binary64 (1e400) parse to non-finite constants.
          if (!Number.isFinite(v)) {
            const t = loc.tokens.find((k) => (k.kind === 'number' && !Number.isFinite(Number(k.text))) || (k.kind === 'name' && (k.text === 'Infinity' || k.text === 'NaN')));
            issue('NON_FINITE', `${eqName}: "${t?.text ?? String(v)}" is not a finite number`, t ? { position: t.pos, length: t.text.length } : { position: 0, length: 1 });
          }
          return;
        }
        if (typeof v === 'string') issue('FORBIDDEN_SYNTAX', `${eqName}: text strings are not allowed (${describe(node)})`, loc.kind('string'));
        else issue('FORBIDDEN_SYNTAX', `${eqName}: "${String(v)}" is not a number`, loc.name(String(v)));
        return;
      }
      case 'SymbolNode': {
        const name = node.name as string;
        if (known.has(name) || libraryConstants.has(name)) {
          symbols.add(name);
          return;
        }
        const where = loc.name(name, false);
        if (isAllowedFunction(name)) issue('FORBIDDEN_SYNTAX', `${eqName}: the function "${name}" needs its arguments in parentheses`, where);
        else if (name === target) issue('UNKNOWN_SYMBOL', `${eqName}: ${quantityName(name)} is defined by this equation and cannot be used on its right side`, where);
        else if (laterTargets.has(name)) issue('UNKNOWN_SYMBOL', `${eqName}: ${quantityName(name)} is used before it is defined (by equation ${(laterTargets.get(name) ?? 0) + 1}); equations are evaluated in order`, where);
        else issue('UNKNOWN_SYMBOL', `${eqName}: unknown symbol "${name}" (not an input quantity, a constant or a quantity defined by an earlier equation)`, where);
        return;
      }
      case 'ParenthesisNode':
        visit(node.content as AnyNode, depth + 1);
        return;
      case 'OperatorNode': {
        const fn = node.fn as string;
        const op = node.op as string;
        if (!ALLOWED_OPERATORS.has(fn)) {
          const relational = ['equal', 'unequal', 'smaller', 'larger', 'smallerEq', 'largerEq'].includes(fn);
          issue('FORBIDDEN_SYNTAX', relational ? `${eqName}: comparison "${op}" is not allowed` : `${eqName}: operator "${op}" is not allowed; use + - * / ^`, loc.op(op));
        } else if (node.implicit) {
          issue('FORBIDDEN_SYNTAX', `${eqName}: write "*" between factors (implicit multiplication "${describe(node)}" is not allowed)`, loc.implicit());
        }
        for (const a of node.args as AnyNode[]) visit(a, depth + 1);
        return;
      }
      case 'FunctionNode': {
        const fnNode = node.fn as AnyNode;
        const args = node.args as AnyNode[];
        if (fnNode.type !== 'SymbolNode') {
          issue('FORBIDDEN_SYNTAX', `${eqName}: only named functions can be called ("${describe(node)}")`, fnNode.type === 'AccessorNode' ? loc.dot() : { position: 0, length: 1 });
          visit(fnNode, depth + 1);
        } else {
          const name = fnNode.name as string;
          if (!isAllowedFunction(name)) {
            issue('UNKNOWN_FUNCTION', `${eqName}: unknown function "${name}"; allowed: ${ALL_FUNCTION_NAMES.join(', ')}`, loc.name(name, true));
          } else {
            const { min, max } = arityOf(name);
            if (args.length < min || args.length > max) {
              const sig = RADIOMETRIC_SIGNATURES[name];
              const expected = sig ? `${sig.length} argument${sig.length === 1 ? '' : 's'} (${sig.join(', ')})` : min === max ? `${min} argument${min === 1 ? '' : 's'}` : `at least ${min} argument`;
              issue('FORBIDDEN_SYNTAX', `${eqName}: ${name} takes ${expected}, not ${args.length}${name === 'log' ? ' (log is the natural logarithm; write log(x)/log(b) for another base)' : ''}`, loc.name(name, true));
            }
          }
        }
        for (const a of args) visit(a, depth + 1);
        return;
      }
      case 'AccessorNode': {
        const index = node.index as AnyNode | undefined;
        const dot = !!index && (index as Record<string, unknown>).dotNotation === true;
        issue('FORBIDDEN_SYNTAX', dot ? `${eqName}: property access "${describe(node)}" is not allowed` : `${eqName}: indexing "${describe(node)}" is not allowed`, dot ? loc.dot() : loc.bracket(true));
        return;
      }
      case 'IndexNode':
        issue('FORBIDDEN_SYNTAX', `${eqName}: indexing is not allowed`, loc.bracket(true));
        return;
      case 'ArrayNode':
        issue('FORBIDDEN_SYNTAX', `${eqName}: matrices and lists ("${describe(node)}") are not allowed`, loc.bracket(false));
        return;
      case 'ObjectNode':
        issue('FORBIDDEN_SYNTAX', `${eqName}: objects ("${describe(node)}") are not allowed`, loc.op('{'));
        return;
      case 'AssignmentNode':
        issue('FORBIDDEN_SYNTAX', `${eqName}: assignment inside an expression is not allowed; "=" appears once, after the symbol the equation defines`, loc.op('='));
        return;
      case 'FunctionAssignmentNode':
        issue('FORBIDDEN_SYNTAX', `${eqName}: function definitions are not allowed`, loc.op('='));
        return;
      case 'RangeNode':
        issue('FORBIDDEN_SYNTAX', `${eqName}: ranges ("${describe(node)}") are not allowed`, loc.op(':'));
        return;
      case 'ConditionalNode':
        issue('FORBIDDEN_SYNTAX', `${eqName}: conditional expressions ("? :") are not allowed`, loc.op('?'));
        return;
      case 'RelationalNode':
        issue('FORBIDDEN_SYNTAX', `${eqName}: comparisons ("${describe(node)}") are not allowed`, loc.op(((node.conditionals as string[]) ?? [])[0] === 'smaller' ? '<' : '>'));
        return;
      case 'BlockNode':
        issue('FORBIDDEN_SYNTAX', `${eqName} holds more than one statement`, loc.op(';'));
        return;
      default:
        issue('FORBIDDEN_SYNTAX', `${eqName}: "${describe(node)}" (${node.type}) is not allowed`, { position: 0, length: 1 });
    }
  };
  visit(expr, 0);
  issues.sort((a, b) => a.position - b.position);
  if (issues.length > 0) return { issues };
  return { checked: { index: equation, text, target, expr, symbols: [...symbols] }, issues };
}

export interface CheckEquationsResult {
  ok: boolean;
  errors: EquationIssue[];
  /** Symbols defined by the equations, in order. */
  defines: string[];
}

/**
 * Check the equations of a model in order (the template editor's live errors). `knownSymbols`
 * are the input and constant symbols; library constants are always known. An equation may use
 * only symbols defined before it, and may not redefine an input, a constant or an earlier
 * equation's symbol.
 */
export function checkEquations(equations: readonly string[], knownSymbols: readonly string[]): CheckEquationsResult & { checked: CheckedEquation[] } {
  const base = new Set(knownSymbols);
  const known = new Set(knownSymbols);
  const targets = scanTargets(equations);
  const errors: EquationIssue[] = [];
  const defines: string[] = [];
  const checked: CheckedEquation[] = [];
  equations.forEach((text, i) => {
    const later = new Map([...targets].filter(([, j]) => j > i));
    const r = checkEquation(text, i, known, later);
    errors.push(...r.issues);
    const target = r.checked?.target ?? [...targets].find(([, j]) => j === i)?.[0];
    if (!target) return;
    const where = { position: Math.max(0, text.indexOf(target)), length: target.length };
    if (base.has(target)) errors.push({ equation: i, code: 'FORBIDDEN_SYNTAX', message: `equation ${i + 1} redefines ${quantityName(target)}, which is an input quantity or a constant`, ...where });
    else if (defines.includes(target)) errors.push({ equation: i, code: 'FORBIDDEN_SYNTAX', message: `equation ${i + 1} defines ${quantityName(target)} again (already defined by equation ${defines.indexOf(target) + 1})`, ...where });
    else {
      defines.push(target);
      known.add(target);
      if (r.checked) checked.push(r.checked);
    }
  });
  return { ok: errors.length === 0, errors, defines, checked };
}
