/** Codes of the engine's own, expected failures. */
export type EngineErrorCode =
  | 'INVALID_DOCUMENT'
  | 'PARSE_ERROR'
  | 'UNKNOWN_SYMBOL'
  | 'UNKNOWN_FUNCTION'
  | 'FORBIDDEN_SYNTAX'
  | 'TOO_LARGE'
  | 'UNDEFINED_MEASURAND'
  | 'NON_FINITE'
  | 'INVALID_DISTRIBUTION'
  | 'NOT_POSITIVE_DEFINITE'
  | 'UNIT_MISMATCH'
  | 'TOO_FEW_READINGS'
  | 'CANCELLED';

/**
 * The only error the engine throws on bad input. `position` is the 0-based character offset in
 * `equation` (index into doc.equations) where the problem starts, when known.
 */
export class EngineError extends Error {
  readonly code: EngineErrorCode;
  readonly equation?: number;
  readonly position?: number;
  readonly path?: Array<string | number>;
  /** Every problem found, for INVALID_DOCUMENT (one per zod issue, with its path). */
  readonly issues?: Array<{ path: Array<string | number>; message: string }>;

  constructor(
    code: EngineErrorCode,
    message: string,
    where: { equation?: number; position?: number; path?: Array<string | number>; issues?: Array<{ path: Array<string | number>; message: string }> } = {},
  ) {
    super(message);
    this.name = 'EngineError';
    this.code = code;
    this.equation = where.equation;
    this.position = where.position;
    this.path = where.path;
    this.issues = where.issues;
  }
}
