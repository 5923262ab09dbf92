/**
 * The radiometric library as the model compiler sees it: functions passed into generated code
 * as parameters (closure), never looked up by name at run time, and the radiation constants.
 * Implemented in ../radiometry (formulas and sources documented there).
 */
import { RADIOMETRIC_FUNCTIONS, RADIATION_CONSTANTS } from '../radiometry';
import type { RadiometricLibrary } from './library-types';

export type { RadiometricLibrary };

export const defaultLibrary: RadiometricLibrary = {
  functions: Object.fromEntries(Object.entries(RADIOMETRIC_FUNCTIONS).map(([name, def]) => [name, def.fn])),
  constants: { ...RADIATION_CONSTANTS },
};
