import { z } from 'zod';

/** Kinds of reference standard in a radiation-thermometry lab. */
export const STANDARD_KINDS = ['blackbody_source', 'reference_thermometer', 'transfer_radiation_thermometer', 'spectroradiometer', 'other'] as const;
export const standardKindSchema = z.enum(STANDARD_KINDS, { error: 'Choose the kind of standard.' });
export type StandardKind = z.infer<typeof standardKindSchema>;

export const STANDARD_KIND_LABELS: Record<StandardKind, string> = {
  blackbody_source: 'Blackbody source',
  reference_thermometer: 'Reference thermometer',
  transfer_radiation_thermometer: 'Transfer radiation thermometer',
  spectroradiometer: 'Spectroradiometer',
  other: 'Other',
};

export const STANDARD_STATUSES = ['in_service', 'out_of_service', 'withdrawn'] as const;
export const standardStatusSchema = z.enum(STANDARD_STATUSES, { error: 'Choose in service, out of service or withdrawn.' });
export type StandardStatus = z.infer<typeof standardStatusSchema>;

export const STANDARD_STATUS_LABELS: Record<StandardStatus, string> = {
  in_service: 'In service',
  out_of_service: 'Out of service',
  withdrawn: 'Withdrawn',
};

/** Days before the due date from which a standard counts as due soon. */
export const DUE_SOON_DAYS = 30;

/** Where a standard stands against its due date, computed from the server's clock. */
export const DUE_STATES = ['ok', 'due_soon', 'overdue'] as const;
export type DueState = (typeof DUE_STATES)[number];

const isoDate = (what: string) =>
  z
    .string({ error: `Enter the ${what} as YYYY-MM-DD.` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `Enter the ${what} as YYYY-MM-DD.`)
    .refine((s) => {
      const d = new Date(`${s}T00:00:00Z`);
      return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
    }, `The ${what} is not a real calendar date.`);

const finite = (what: string) => z.number({ error: `Enter the ${what} as a number.` }).refine(Number.isFinite, `The ${what} must be a finite number.`);
const text = (what: string, max = 200) => z.string({ error: `Enter the ${what}.` }).trim().min(1, `Enter the ${what}.`).max(max, `The ${what} is longer than ${max} characters.`);

/** One certified value: quantity, value, unit, U and k, optionally at a point (value + unit). */
export const certifiedValueInputSchema = z
  .object({
    id: z.uuid().optional(),
    quantity: text('quantity'),
    value: finite('value'),
    unit: z.string().trim().max(50),
    expandedUncertainty: finite('expanded uncertainty U').refine((v) => v >= 0, 'The expanded uncertainty U cannot be negative.'),
    coverageFactor: finite('coverage factor k').refine((v) => v > 0, 'The coverage factor k must be greater than zero.'),
    atValue: finite('point').nullish(),
    atUnit: z.string().trim().max(50).nullish(),
  })
  .superRefine((v, ctx) => {
    if (v.atValue != null && !v.atUnit) ctx.addIssue({ code: 'custom', path: ['atUnit'], message: 'Give the unit of the point.' });
  });
export type CertifiedValueInput = z.infer<typeof certifiedValueInputSchema>;

export const standardInputSchema = z
  .object({
    name: text('name'),
    kind: standardKindSchema,
    serialNumber: text('serial number', 100),
    certificateNumber: text('certificate number', 100),
    issuingLaboratory: text('issuing laboratory'),
    calibrationDate: isoDate('calibration date'),
    dueDate: isoDate('due date'),
    status: standardStatusSchema.default('in_service'),
    notes: z.string().trim().max(2000).default(''),
    values: z.array(certifiedValueInputSchema).max(200, 'At most 200 certified values.').default([]),
  })
  .superRefine((v, ctx) => {
    if (v.dueDate < v.calibrationDate) ctx.addIssue({ code: 'custom', path: ['dueDate'], message: 'The due date cannot be before the calibration date.' });
  });
export type StandardInput = z.input<typeof standardInputSchema>;
export type StandardInputParsed = z.output<typeof standardInputSchema>;

export const certifiedValueSchema = z.object({
  id: z.string(),
  quantity: z.string(),
  value: z.number(),
  unit: z.string(),
  expandedUncertainty: z.number(),
  coverageFactor: z.number(),
  /** U / k (GUM 6.2.1). */
  standardUncertainty: z.number(),
  atValue: z.number().nullable(),
  atUnit: z.string().nullable(),
});
export type CertifiedValue = z.infer<typeof certifiedValueSchema>;

export const standardFileSchema = z.object({
  name: z.string(),
  size: z.number(),
  sha256: z.string(),
  uploadedAt: z.string(),
});

export const standardSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  kind: standardKindSchema,
  serialNumber: z.string(),
  certificateNumber: z.string(),
  issuingLaboratory: z.string(),
  calibrationDate: z.string(),
  dueDate: z.string(),
  status: standardStatusSchema,
  due: z.enum(DUE_STATES),
  /** Days from today (server clock) to the due date; negative when overdue. */
  daysToDue: z.number(),
  hasCertificateFile: z.boolean(),
});
export type StandardSummary = z.infer<typeof standardSummarySchema>;

export const standardDetailSchema = standardSummarySchema.extend({
  notes: z.string(),
  values: z.array(certifiedValueSchema),
  certificateFile: standardFileSchema.nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type StandardDetail = z.infer<typeof standardDetailSchema>;

export const standardListSchema = z.object({ standards: z.array(standardSummarySchema), today: z.string() });
export const standardResponseSchema = z.object({ standard: standardDetailSchema });

const emptyToUndefined = (v: unknown) => (v === '' ? undefined : v);

/** Query of `GET /api/standards`. */
export const standardListQuerySchema = z.object({
  kind: z.preprocess(emptyToUndefined, standardKindSchema.optional()),
  status: z.preprocess(emptyToUndefined, standardStatusSchema.optional()),
  due: z.preprocess(emptyToUndefined, z.enum(DUE_STATES, { error: 'due must be ok, due_soon or overdue.' }).optional()),
  q: z.preprocess(emptyToUndefined, z.string().trim().max(200).optional()),
});
export type StandardListQuery = z.infer<typeof standardListQuerySchema>;
