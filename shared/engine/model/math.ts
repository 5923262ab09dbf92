/**
 * The engine's private mathjs instance. It is used for parsing, symbolic differentiation and
 * unit parsing only; no expression is ever evaluated by mathjs (see ./compile.ts). The
 * evaluating entry points are replaced by throwing stubs so that nothing reachable from this
 * instance can run user text (STACK-NOTES #9).
 */
import { create, all, type MathJsInstance } from 'mathjs';

const instance: MathJsInstance = create(all);

/** Kept before the lock-down below. */
export const parse = instance.parse;
export const derivative = instance.derivative;
export const unit = instance.unit;
export const ConstantNode = instance.ConstantNode;
export const SymbolNode = instance.SymbolNode;
export const ParenthesisNode = instance.ParenthesisNode;

/** Steradian and radian are SI coherent derived units equal to 1 (SI Brochure, 9th ed., Table 4). */
instance.createUnit('sr', '1 rad^2');

const refuse = (name: string) => () => {
  throw new Error(`${name} is disabled in the engine's mathjs instance`);
};
instance.import(
  {
    import: refuse('import'),
    createUnit: refuse('createUnit'),
    evaluate: refuse('evaluate'),
    compile: refuse('compile'),
    resolve: refuse('resolve'),
    reviver: refuse('reviver'),
  },
  { override: true },
);

export type { MathNode } from 'mathjs';
