import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ApiErrorBody } from '../../shared/schemas/api-error.schema';
import { EngineError } from '../../shared/engine/errors';
import { AppError, NotFoundError } from '../errors/app-error';
import { zodIssues } from '../errors/zod-issues';
import type { Logger } from '../logger';

/** `/api/*` that no route answered: 404 in the envelope (never the SPA's index.html). */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new NotFoundError(`No API route for ${req.method} ${req.originalUrl.split('?')[0]}.`));
};

type HttpishError = { status?: number; statusCode?: number; type?: string; expose?: boolean; message?: string };

/** The one error handler: every failure leaves the API as `{ error: { code, message, issues? } }`. */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err: unknown, req, res, next) => {
    if (res.headersSent) return next(err);
    const send = (status: number, error: ApiErrorBody['error']) => res.status(status).json({ error });

    if (err instanceof AppError) {
      return send(err.status, { code: err.code, message: err.message, ...(err.issues ? { issues: err.issues } : {}) });
    }
    if (err instanceof ZodError) {
      return send(400, { code: 'VALIDATION_FAILED', message: 'The request is not valid: see the issues.', issues: zodIssues(err) });
    }
    if (err instanceof EngineError) {
      const where: Array<string | number> = err.path ?? (err.equation !== undefined ? ['equations', err.equation] : []);
      return send(422, {
        code: err.code,
        message: err.message,
        issues: [{ path: where, message: err.position !== undefined ? `${err.message} (at character ${err.position + 1})` : err.message }],
      });
    }
    const h = (typeof err === 'object' && err !== null ? err : {}) as HttpishError;
    // body-parser errors carry `type` and a 4xx status.
    if (h.type === 'entity.parse.failed') {
      return send(400, { code: 'MALFORMED_JSON', message: 'The request body is not valid JSON.' });
    }
    if (h.type === 'entity.too.large') {
      return send(413, { code: 'PAYLOAD_TOO_LARGE', message: 'The request body is too large.' });
    }
    const status = h.status ?? h.statusCode;
    if (status && status >= 400 && status < 500 && h.expose) {
      return send(status, { code: 'BAD_REQUEST', message: h.message ?? 'The request could not be processed.' });
    }
    logger.error('unhandled error', { method: req.method, url: req.originalUrl, error: err });
    return send(500, { code: 'INTERNAL', message: 'Something went wrong on the server. The problem has been logged.' });
  };
}
