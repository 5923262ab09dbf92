/** The model language: checking, compiling, units. */
import type { BudgetDocument } from '../../schemas/budget.schema';
import { compileModelWith, type CompiledModelDetails, type CompileOptions } from './compile';
import { defaultLibrary } from './library';

export { checkEquations, checkEquation, MAX_EXPRESSION_LENGTH, MAX_NESTING, type EquationIssue, type CheckedEquation, type CheckEquationsResult } from './check';
export { compileModelWith, differenceStep, type CompiledModelDetails, type CompileOptions } from './compile';
export { ELEMENTARY_FUNCTIONS, RADIOMETRIC_SIGNATURES, LIBRARY_CONSTANT_NAMES } from './language';

/** Compile `doc`'s model with the engine's radiometric library (../radiometry). */
export function compileModel(doc: BudgetDocument, options: CompileOptions = {}): CompiledModelDetails {
  return compileModelWith(doc, defaultLibrary, options);
}
