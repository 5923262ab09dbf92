/**
 * Everything a calibration certificate says: the input of the PDF renderer and, later, the
 * frozen JSON stored with an issued certificate.
 *
 * Coverage of ISO/IEC 17025:2017 (see ../../../shared/reference/README.md §5):
 * 7.8.2.1 a) title, b) lab name and address, c) location of the activity, d) page identity and a
 * clear end (rendered), e) customer, f) method, g) item and its condition, h) date of receipt,
 * i) date(s) of calibration, j) date of issue, l) results relate only to the item,
 * m) results with units, n) deviations, additions, exclusions, o) authorising person;
 * 7.8.4.1 uncertainty, environmental conditions, traceability, conformity where relevant;
 * 7.8.6 decision rule; 7.8.8 amendment (number + reason).
 *
 * Units: every number in a result point and its annex is already in the unit printed beside it
 * (`unit`), converted by the caller from the engine's SI values (e.g. K → °C for a temperature,
 * K ≡ °C for a difference). The annex mirrors shared/engine/types.ts `EvaluationResult`
 * (gum.budget rows are `BudgetRow` plus a meaning and a unit) so that wiring is a copy.
 */
import { z } from 'zod';

const text = (max = 500) => z.string().trim().min(1).max(max);
const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });
/** ISO 8601 calendar date, YYYY-MM-DD. */
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, { message: 'date must be YYYY-MM-DD' });
/** ISO 8601 date-time with offset or Z. */
const isoDateTime = z.iso.datetime({ offset: true });
/** Degrees of freedom as JSON carries them: a number, or "infinite" (JSON has no ∞). */
const dof = z.union([z.number().positive(), z.literal('infinite')]);

export const certificateLabSchema = z.object({
  name: text(200),
  /** Postal address; line breaks separate the printed lines. */
  address: text(1000),
  accreditationNumber: text(100),
  /** Name of the accreditation body, printed with the number when given. */
  accreditationBody: z.string().trim().max(200).optional(),
  /** 7.8.2.1 c): where the calibration was performed (the lab's premises, or on site at …). */
  activityLocation: text(500),
  contactEmail: z.string().trim().max(200).optional(),
  contactPhone: z.string().trim().max(50).optional(),
});

export const certificateCustomerSchema = z.object({
  organisation: text(200),
  address: text(1000),
  contact: z.object({ name: text(200), email: z.string().trim().max(200).optional() }),
});

export const certificateItemSchema = z.object({
  description: text(300),
  maker: text(200),
  model: text(200),
  serialNumber: text(100),
  /** The customer's own identification (asset tag), when given. */
  customerId: z.string().trim().max(100).optional(),
  /** 7.8.2.1 g): condition on receipt. */
  conditionOnReceipt: text(1000),
});

export const certificateDatesSchema = z.object({
  receipt: isoDate,
  /** One day, or a range when `to` is given. */
  calibration: z.object({ from: isoDate, to: isoDate.optional() }),
  issue: isoDate,
});

export const certificateMethodSchema = z.object({
  templateName: text(200),
  templateVersion: text(50),
  description: text(4000),
});

/** A measured quantity with its expanded uncertainty, both in `unit`. */
const conditionSchema = z.object({ value: finite, U: z.number().nonnegative(), unit: text(20) });

export const certificateEnvironmentSchema = z.object({
  temperature: conditionSchema,
  humidity: conditionSchema,
  /** Any other condition that influences the results (7.8.4.1 a). */
  note: z.string().trim().max(1000).optional(),
});

/** A budget row as the engine computes it (shared/engine/types.ts BudgetRow), plus what a reader needs. */
export const certificateBudgetRowSchema = z.object({
  symbol: text(64),
  /** What the quantity is, in words. */
  meaning: text(300),
  /** Unit of `estimate` and `u`; empty for a dimensionless quantity. */
  unit: z.string().max(40),
  estimate: finite,
  u: z.number().nonnegative(),
  distribution: text(40),
  c: finite,
  /** Unit of the sensitivity coefficient, e.g. "K/K"; optional. */
  cUnit: z.string().max(40).optional(),
  /** |c_i| u(x_i), in the measurand's unit. */
  contribution: z.number().nonnegative(),
  dof,
  /** (c_i u(x_i))² / Σ (c_j u(x_j))², 0…1. */
  share: z.number().min(0).max(1),
  cMethod: z.enum(['symbolic', 'numeric']).optional(),
});

export const certificateAnnexSchema = z.object({
  /** The model equations as printed (plain text). */
  equations: z.array(text(500)).max(20).default([]),
  gum: z.object({
    y: finite,
    u: z.number().nonnegative(),
    nuEff: z.union([z.number().positive(), z.literal('infinite'), z.null()]),
    k: z.number().positive(),
    U: z.number().nonnegative(),
    coverage: z.number().gt(0).lt(1),
    interval: z.tuple([finite, finite]),
    budget: z.array(certificateBudgetRowSchema).min(1).max(60),
  }),
  mcm: z
    .object({
      trials: z.number().int().positive(),
      seed: z.number().int(),
      y: finite,
      u: z.number().nonnegative(),
      interval: z.tuple([finite, finite]),
      intervalKind: z.enum(['shortest', 'symmetric']),
      histogram: z
        .object({ edges: z.array(finite).min(2).max(1001), counts: z.array(z.number().int().nonnegative()).min(1).max(1000) })
        .refine((h) => h.edges.length === h.counts.length + 1, { message: 'a histogram needs one more edge than counts' }),
    })
    .nullable(),
  validation: z.object({ delta: z.number(), dLow: z.number(), dHigh: z.number(), passed: z.boolean() }).nullable(),
});

export const CONFORMITY_RESULTS = ['pass', 'conditional-pass', 'conditional-fail', 'fail'] as const;

export const certificateResultPointSchema = z.object({
  /** The set point as printed, e.g. "100 °C"; with the number for sorting and plots. */
  nominal: z.object({ value: finite, unit: z.string().max(40), label: text(100) }),
  measurand: z.object({ symbol: text(64), name: text(200) }),
  value: finite,
  U: z.number().nonnegative(),
  k: z.number().positive(),
  coverageProbability: z.number().gt(0).lt(1),
  unit: z.string().max(40),
  /** The engine's reported strings (U to two significant digits, value to the same place, k with two decimals). */
  reported: z.object({ value: text(40), U: text(40), unit: z.string().max(40), k: text(10) }),
  conformity: z.enum(CONFORMITY_RESULTS).optional(),
  /** The point lies outside the lab's scope of accreditation: marked and footnoted. */
  outsideAccreditation: z.boolean().default(false),
  /** Which evaluation gave the reported value and U: the GUM (JCGM 100) or Monte Carlo (JCGM 101 §8.1). */
  reportedFrom: z.enum(['gum', 'mcm']).default('gum'),
  /** Why the Monte Carlo result is the one reported (printed as a note to the point). */
  monteCarloNote: z.string().trim().max(1000).optional(),
  annex: certificateAnnexSchema.optional(),
});

export const certificateStandardSchema = z.object({
  name: text(200),
  serialNumber: text(100),
  certificateNumber: text(100),
  issuingLaboratory: text(300),
  dueDate: isoDate,
});

export const DEFAULT_STATEMENTS = {
  relatesOnlyToItem: 'The results relate only to the item calibrated, in the condition described above, at the time of calibration.',
  reproduceInFull: 'This certificate shall not be reproduced except in full without the written approval of the issuing laboratory.',
} as const;

export const certificateSchema = z.object({
  certificateNumber: text(60),
  /** 7.8.8: this certificate replaces an earlier one. */
  amends: z.object({ certificateNumber: text(60), reason: text(2000) }).optional(),
  lab: certificateLabSchema,
  customer: certificateCustomerSchema,
  item: certificateItemSchema,
  dates: certificateDatesSchema,
  method: certificateMethodSchema,
  environment: certificateEnvironmentSchema,
  /** What the results table calls the measurand column (template wording), e.g. "Error of indication". */
  resultLabel: text(200).default('Result'),
  results: z.array(certificateResultPointSchema).min(1).max(100),
  /** 7.8.6: present only when the customer asked for a statement of conformity. */
  conformity: z
    .object({ specification: text(1000), decisionRule: text(2000), statement: text(2000) })
    .optional(),
  traceability: z.object({
    statement: text(2000),
    standards: z.array(certificateStandardSchema).min(1).max(50),
  }),
  statements: z
    .object({
      relatesOnlyToItem: text(1000).default(DEFAULT_STATEMENTS.relatesOnlyToItem),
      reproduceInFull: text(1000).default(DEFAULT_STATEMENTS.reproduceInFull),
      /** 7.8.2.1 n): deviations from, additions to or exclusions from the method; empty: none. */
      deviations: z.array(text(2000)).max(20).default([]),
      /** Further statements from the template wording. */
      remarks: z.array(text(2000)).max(20).default([]),
    })
    .prefault({}),
  signatory: z.object({ name: text(200), function: text(200) }),
  approvedAt: isoDateTime,
});

/** What the renderer takes (defaults applied). */
export type CertificateData = z.output<typeof certificateSchema>;
/** What a caller may pass to `certificateSchema.parse` (defaults optional). */
export type CertificateInput = z.input<typeof certificateSchema>;
export type CertificateResultPoint = CertificateData['results'][number];
export type CertificateAnnex = NonNullable<CertificateResultPoint['annex']>;
export type CertificateBudgetRow = CertificateAnnex['gum']['budget'][number];
export type ConformityResult = (typeof CONFORMITY_RESULTS)[number];
