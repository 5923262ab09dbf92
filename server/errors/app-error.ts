import type { ApiIssue } from '../../shared/schemas/api-error.schema';

/**
 * A failure the client is meant to see. The error handler answers with `status` and the envelope
 * `{ error: { code, message, issues? } }`. `message` is shown to people: say what is wrong and,
 * where possible, how to put it right.
 */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues?: ApiIssue[],
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class ValidationError extends AppError {
  constructor(issues: ApiIssue[], message = 'The request is not valid: see the issues.') {
    super(400, 'VALIDATION_FAILED', message, issues);
  }
}

export class UnauthorizedError extends AppError {
  constructor(message = 'Sign in to continue.') {
    super(401, 'UNAUTHORIZED', message);
  }
}

export class ForbiddenError extends AppError {
  constructor(message = 'Your role does not allow this.') {
    super(403, 'FORBIDDEN', message);
  }
}

export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super(404, 'NOT_FOUND', message);
  }
}

export class ConflictError extends AppError {
  constructor(message: string, code = 'CONFLICT') {
    super(409, code, message);
  }
}
