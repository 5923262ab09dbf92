import { z } from 'zod';

const blank = (v: unknown) => (v === '' ? undefined : v);
const day = (what: string) =>
  z.preprocess(
    blank,
    z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/, `${what} must be a date as YYYY-MM-DD.`)
      .optional(),
  );

/** Query of `GET /api/audit` and `GET /api/audit/export.csv`. Dates are whole days (UTC), both ends included. */
export const auditQuerySchema = z
  .object({
    entity: z.preprocess(blank, z.string().trim().max(100).optional()),
    entityId: z.preprocess(blank, z.string().trim().max(100).optional()),
    actorId: z.preprocess(blank, z.string().trim().max(100).optional()),
    from: day('from'),
    to: day('to'),
    page: z.preprocess(blank, z.coerce.number({ error: 'page must be a whole number.' }).int('page must be a whole number.').min(1, 'page starts at 1.').default(1)),
    pageSize: z.preprocess(
      blank,
      z.coerce.number({ error: 'pageSize must be a whole number.' }).int('pageSize must be a whole number.').min(1).max(200, 'pageSize is at most 200.').default(50),
    ),
  })
  .superRefine((v, ctx) => {
    if (v.from && v.to && v.to < v.from) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The end date is before the start date.' });
  });
export type AuditQuery = z.infer<typeof auditQuerySchema>;

export const auditEntrySchema = z.object({
  seq: z.number(),
  at: z.string(),
  actorId: z.string().nullable(),
  actorName: z.string().nullable(),
  actorRole: z.string().nullable(),
  action: z.string(),
  entity: z.string(),
  entityId: z.string(),
  before: z.unknown(),
  after: z.unknown(),
  hash: z.string(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

export const auditPageSchema = z.object({
  entries: z.array(auditEntrySchema),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
});
export type AuditPage = z.infer<typeof auditPageSchema>;

export const auditFacetsSchema = z.object({
  entities: z.array(z.string()),
  actors: z.array(z.object({ id: z.string(), name: z.string().nullable() })),
});
export type AuditFacets = z.infer<typeof auditFacetsSchema>;

export const auditVerifySchema = z.object({
  ok: z.boolean(),
  checked: z.number(),
  firstBrokenSeq: z.number().optional(),
  reason: z.string().optional(),
  lastSeq: z.number().optional(),
  lastHash: z.string().optional(),
  verifiedAt: z.string(),
});
export type AuditVerifyResult = z.infer<typeof auditVerifySchema>;

/** Words shown for each kind of audited record. Unknown kinds are shown as they are. */
export const AUDIT_ENTITY_LABELS: Record<string, string> = {
  user: 'User',
  lab_settings: 'Laboratory details',
  reference_standard: 'Reference standard',
  customer: 'Customer',
  customer_contact: 'Customer contact',
  customer_item: 'Customer item',
};
