import type { z } from 'zod';
import type { ApiIssue } from '../../shared/schemas/api-error.schema';

/** Zod issues as envelope issues: `{ path, message }`, path optionally prefixed. */
export function zodIssues(error: z.ZodError, prefix: Array<string | number> = []): ApiIssue[] {
  return error.issues.map((i) => ({
    path: [...prefix, ...i.path.map((p) => (typeof p === 'symbol' ? String(p) : p))],
    message: i.message,
  }));
}
