import { z } from 'zod';

/** One problem with a request, located by the path of the offending value. */
export const apiIssueSchema = z.object({
  path: z.array(z.union([z.string(), z.number()])),
  message: z.string(),
});
export type ApiIssue = z.infer<typeof apiIssueSchema>;

/**
 * The one error envelope every API failure answers with:
 * `{ "error": { "code", "message", "issues"? } }`.
 * `code` is a stable machine word (e.g. `VALIDATION_FAILED`, `UNAUTHORIZED`, `NOT_FOUND`);
 * `message` is a sentence for people.
 */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    issues: z.array(apiIssueSchema).optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof apiErrorSchema>;
