import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { ValidationError } from '../errors/app-error';
import { zodIssues } from '../errors/zod-issues';

type Schemas = { params?: z.ZodType; query?: z.ZodType; body?: z.ZodType };

/**
 * Validates a request with zod and keeps the parsed (transformed, defaulted) values:
 * `req.params` and `req.body` are replaced; the query goes to `res.locals.query` because
 * `req.query` is a getter in Express 5. Problems from all three parts are reported together,
 * each path prefixed with `params`, `query` or `body`.
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    const issues = [];
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const input = part === 'body' ? (req.body ?? {}) : req[part];
      const result = schema.safeParse(input);
      if (!result.success) {
        issues.push(...zodIssues(result.error, [part]));
        continue;
      }
      if (part === 'query') res.locals.query = result.data;
      else if (part === 'params') req.params = result.data as typeof req.params;
      else req.body = result.data;
    }
    if (issues.length) return next(new ValidationError(issues));
    next();
  };
}
