/**
 * How the engine's messages name the quantities of a model: by the plain-text reading of the
 * identifier that the screens, the server's check reasons and the certificate use
 * (shared/format/symbols.ts `symbolPlain`: eps_bb → ε_bb, dT_drift → δT_drift, lambda_eff →
 * λ_eff; ISO 80000-1 §7.1), so that a warning reads like the budget table beside it. The
 * identifier itself stays the key: in the document, and in an error's `path` or `equation`.
 *
 * What the author typed and the model does not know (an unknown name, an invalid symbol, refused
 * syntax) is quoted as typed, since it has to be found in the equation text; so are unit texts
 * and document paths.
 *
 * shared/format/symbols.ts imports nothing (no I/O, no clock, no randomness), and is imported
 * by file, not through shared/format's index, which would also bring in d3-array.
 */
import { symbolPlain } from '../../format/symbols';
import type { MathNode } from './math';

type AnyNode = MathNode & Record<string, unknown>;

/** A model identifier (input, constant, defined quantity, measurand) as a message names it. */
export function quantityName(identifier: string): string {
  return symbolPlain(identifier);
}

/** Several identifiers, comma-separated. */
export function quantityNames(identifiers: readonly string[]): string {
  return identifiers.map(quantityName).join(', ');
}

/**
 * A checked expression as a message quotes it, each symbol read as {@link quantityName} and
 * function names as written (planck, exp): "ε_bb * planck(λ, T)" for eps_bb * planck(lambda, T).
 */
export function expressionText(node: MathNode): string {
  const handler = (n: AnyNode, options: object): string | undefined => {
    if (n.type === 'SymbolNode') return quantityName(n.name as string);
    if (n.type === 'FunctionNode') {
      const fn = n.fn as AnyNode;
      if (fn.type !== 'SymbolNode') return undefined;
      return `${fn.name as string}(${(n.args as MathNode[]).map((a) => a.toString(options)).join(', ')})`;
    }
    return undefined;
  };
  return node.toString({ handler } as Parameters<MathNode['toString']>[0]);
}
