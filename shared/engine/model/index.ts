/** The model language: checking, compiling, units. */
import type { BudgetDocument } from '../../schemas/budget.schema';
import { compileModelWith, type CompiledModelDetails, type CompileOptions } from './compile';
import { defaultLibrary } from './library';

export { checkEquations, checkEquation, MAX_EXPRESSION_LENGTH, MAX_NESTING, type EquationIssue, type CheckedEquation, type CheckEquationsResult } from './check';
export { compileModelWith, differenceStep, type CompiledModelDetails, type CompileOptions } from './compile';
export { ELEMENTARY_FUNCTIONS, RADIOMETRIC_SIGNATURES, LIBRARY_CONSTANT_NAMES } from './language';

/** Compiled models kept for reuse (least recently used dropped first). */
export const COMPILE_CACHE_SIZE = 64;
const compiled = new Map<string, CompiledModelDetails>();

/**
 * What compileModelWith reads from a document: the equations, the input symbols in order, the
 * document constants and the measurand symbol (never an input's value or distribution).
 */
function compileKey(doc: BudgetDocument, options: CompileOptions): string {
  return JSON.stringify([doc.equations, doc.inputs.map((i) => i.symbol), doc.constants ?? null, doc.measurand?.symbol ?? null, options.codegen ?? null]);
}

/**
 * Compile `doc`'s model with the engine's radiometric library (../radiometry).
 *
 * A budget is recomputed many times with the same model and new input values (the live budget
 * table as the analyst types, the server's GUM requests), and compiling — parsing, the
 * allow-list check, symbolic derivatives, code generation — took about 1.2 ms of the 1.5 ms of a
 * GUM evaluation of a shipped template (measured on the development machine; `npm run bench`
 * prints compileModel's time for its model). The compiled model depends only on
 * what compileKey lists and holds no state between calls, so the same object is handed out again
 * for the same key. A refused model is not kept: it is checked, and refused, every time.
 */
export function compileModel(doc: BudgetDocument, options: CompileOptions = {}): CompiledModelDetails {
  const key = compileKey(doc, options);
  const hit = compiled.get(key);
  if (hit) {
    compiled.delete(key);
    compiled.set(key, hit);
    return hit;
  }
  const model = compileModelWith(doc, defaultLibrary, options);
  compiled.set(key, model);
  if (compiled.size > COMPILE_CACHE_SIZE) compiled.delete(compiled.keys().next().value as string);
  return model;
}
