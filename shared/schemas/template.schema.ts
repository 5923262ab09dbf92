/**
 * A measurement-model template: the budget document (budget.schema.ts) whose inputs carry
 * definitions and defaults, plus what the laboratory needs to run and report it: where each
 * input's value comes from, the CMC table, the default decision rule, the certificate wording and
 * a reference case that release validation must reproduce (ISO/IEC 17025:2017 §7.2.2).
 */
import { z } from 'zod';
import { budgetObjectSchema, checkBudgetConsistency, inputSchema, measurandSchema, symbolSchema, type BudgetDocument } from './budget.schema';

export const INPUT_SOURCES = ['readings', 'reference', 'fixed', 'entered'] as const;
export type InputSource = (typeof INPUT_SOURCES)[number];

/** Plain-language names of the value sources, for screens and exports. */
export const INPUT_SOURCE_LABELS: Record<InputSource, string> = {
  readings: 'repeated readings (Type A)',
  reference: 'reference standard certificate',
  fixed: 'fixed by the method',
  entered: 'entered by the analyst (Type B)',
};

export const templateInputSchema = inputSchema.extend({
  description: z.string({ error: 'each input needs a meaning' }).min(1, { message: 'each input needs a meaning' }).max(500),
  unit: z.string().max(64).optional(),
  /** Where the value comes from when a job fills the budget. */
  source: z.enum(INPUT_SOURCES, { error: `source must be one of: ${INPUT_SOURCES.join(', ')}` }),
  /** Unit shown to people (°C, nm, µm …); the budget itself is always in `unit` (SI). */
  displayUnit: z.string().max(64).optional(),
  /** Kind of reference standard expected when source = reference (free text, e.g. "reference thermometer"). */
  referenceKind: z.string().max(100).optional(),
});
export type TemplateInput = z.infer<typeof templateInputSchema>;

export const cmcRowSchema = z
  .object({
    from: z.number({ error: 'from must be a number' }),
    to: z.number({ error: 'to must be a number' }),
    /** Smallest expanded uncertainty the lab may state in this range, in the measurand's unit, or relative (fraction) when `relative`. */
    U: z.number({ error: 'U must be a number' }).positive({ message: 'the CMC U must be greater than zero' }),
    relative: z.boolean().optional(),
  })
  .strict()
  .refine((r) => r.from < r.to, { message: 'a CMC range needs from < to', path: ['to'] });

export const cmcSchema = z
  .object({
    /** The quantity whose value selects the row: the measurand (default) or an input (e.g. the reference temperature). */
    basis: symbolSchema.optional(),
    /** Unit of `from`/`to` (the basis quantity's SI unit). */
    unit: z.string().max(64).optional(),
    rows: z.array(cmcRowSchema).max(100),
  })
  .strict();
export type Cmc = z.infer<typeof cmcSchema>;

export const DECISION_RULES = ['none', 'simple', 'guard-band'] as const;
/** ILAC-G8:2019 §4: simple acceptance (w = 0) or a guard band w = U. */
export const decisionRuleSchema = z
  .object({
    kind: z.enum(DECISION_RULES, { error: `decision rule must be one of: ${DECISION_RULES.join(', ')}` }),
    /** Tolerance of the specification, in the measurand's unit (symmetric ± limit), when a conformity statement is asked for. */
    tolerance: z.number().positive().optional(),
    statement: z.string().max(2000).optional(),
  })
  .strict();
export type DecisionRule = z.infer<typeof decisionRuleSchema>;

export const certificateWordingSchema = z
  .object({
    /** What the results table calls the measurand, e.g. "Error of indication". */
    resultLabel: z.string().min(1).max(200),
    /** The method paragraph printed on the certificate. */
    methodStatement: z.string().min(1).max(4000),
    /** Extra statements printed after the results. */
    statements: z.array(z.string().max(2000)).max(20).optional(),
  })
  .strict();

export const referenceCaseSchema = z
  .object({
    /** Where the expected values come from (an independent calculation, a published example). */
    source: z.string().min(1, { message: 'the reference case must name its source' }).max(1000),
    /** Input overrides: symbol → estimate; the template defaults are used for the rest. */
    inputs: z.record(symbolSchema, z.number()).optional(),
    expected: z.object({ y: z.number(), u: z.number().nonnegative() }).strict(),
    tolerance: z
      .object({ yAbs: z.number().nonnegative().optional(), yRel: z.number().nonnegative().optional(), uRel: z.number().positive() })
      .strict(),
  })
  .strict();
export type ReferenceCase = z.infer<typeof referenceCaseSchema>;

export const templateDefinitionObjectSchema = budgetObjectSchema.extend({
  /** Stable identifier of the shipped template (kebab-case); absent for lab-written ones. */
  key: z.string().regex(/^[a-z0-9-]+$/).max(100).optional(),
  name: z.string({ error: 'the template needs a name' }).min(3, { message: 'the name needs at least 3 characters' }).max(200),
  summary: z.string().max(500).optional(),
  /** The model described in words, with its published sources. */
  description: z.string().max(8000).optional(),
  sources: z.array(z.string().max(1000)).max(30).optional(),
  /** Says which magnitudes are invented for the demonstration. */
  demoNote: z.string().max(2000).optional(),
  measurand: measurandSchema.extend({ description: z.string().min(1, { message: 'the measurand needs a description' }).max(500) }),
  inputs: z.array(templateInputSchema).min(1, { message: 'at least one input quantity is needed' }).max(200),
  cmc: cmcSchema.optional(),
  decisionRule: decisionRuleSchema.optional(),
  certificate: certificateWordingSchema,
  referenceCase: referenceCaseSchema.optional(),
});

export const templateDefinitionSchema = templateDefinitionObjectSchema.superRefine(checkBudgetConsistency);
export type TemplateDefinition = z.infer<typeof templateDefinitionSchema>;

/** The budget document of a template at its defaults (drops what only the lab's workflow uses). */
export function budgetFromTemplate(t: TemplateDefinition, overrides: Record<string, number> = {}): BudgetDocument {
  return {
    measurand: t.measurand,
    equations: t.equations,
    constants: t.constants,
    inputs: t.inputs.map((i) => {
      const base = { symbol: i.symbol, unit: i.unit, description: i.description, distribution: i.distribution, dof: i.dof };
      return i.symbol in overrides ? { ...base, distribution: shiftEstimate(i.distribution, overrides[i.symbol]!) } : base;
    }),
    correlations: t.correlations,
    coverage: t.coverage,
    monteCarlo: t.monteCarlo,
    reportDigits: t.reportDigits,
  };
}

type Dist = TemplateInput['distribution'];

/** Move a distribution so that its estimate becomes `value`, keeping its width. */
export function shiftEstimate(d: Dist, value: number): Dist {
  switch (d.type) {
    case 'normal':
    case 'student-t':
      return { ...d, mean: value } as Dist;
    case 'rectangular':
      if ('mean' in d) return { ...d, mean: value };
      return { ...d, min: value - (d.max - d.min) / 2, max: value + (d.max - d.min) / 2 };
    case 'triangular': {
      const mid = d.mode ?? (d.min + d.max) / 2;
      const shift = value - mid;
      return { ...d, min: d.min + shift, max: d.max + shift, ...(d.mode === undefined ? {} : { mode: d.mode + shift }) };
    }
    case 'arcsine':
    case 'trapezoidal':
    case 'curvilinear-trapezoid': {
      const shift = value - (d.min + d.max) / 2;
      return { ...d, min: d.min + shift, max: d.max + shift };
    }
    case 'readings': {
      const mean = d.values.reduce((a, b) => a + b, 0) / d.values.length;
      return { ...d, values: d.values.map((v) => v - mean + value) };
    }
    case 'exponential':
      return { ...d, mean: value };
    case 'gamma':
      return { ...d, scale: value / d.shape };
    case 'constant':
      return { ...d, value };
  }
}

/* ------------------------------------------------------------------------------------------
 * API contracts of /api/templates (issue 4): versions, their validation record, list rows.
 * ---------------------------------------------------------------------------------------- */

export const TEMPLATE_STATUSES = ['draft', 'released', 'retired'] as const;
export const templateStatusSchema = z.enum(TEMPLATE_STATUSES);
export type TemplateStatus = z.infer<typeof templateStatusSchema>;

/** Words shown for each status (status is always shown as text, UI-NOTES). */
export const TEMPLATE_STATUS_LABELS: Record<TemplateStatus, string> = {
  draft: 'Draft',
  released: 'Released',
  retired: 'Retired',
};

/** The checks release runs, in order (ISO/IEC 17025:2017 §7.2.2 validation of methods). */
export const VALIDATION_CHECKS = ['schema', 'equations', 'symbols', 'units', 'evaluates', 'reference-case'] as const;
export type ValidationCheckId = (typeof VALIDATION_CHECKS)[number];

export const VALIDATION_CHECK_LABELS: Record<ValidationCheckId, string> = {
  schema: 'The template document is complete and well-formed',
  equations: 'Every equation can be read',
  symbols: 'Every symbol is defined',
  units: 'Units are consistent',
  evaluates: 'The model evaluates at the default values',
  'reference-case': 'The reference case reproduces within its tolerance',
};

const personSchema = z.object({ id: z.string(), name: z.string() });
export type Person = z.infer<typeof personSchema>;

export const validationMessageSchema = z.object({
  message: z.string(),
  path: z.array(z.union([z.string(), z.number()])).optional(),
  /** 0-based equation index and character position, for equation problems. */
  equation: z.number().int().optional(),
  position: z.number().int().optional(),
  length: z.number().int().optional(),
});
export type ValidationMessage = z.infer<typeof validationMessageSchema>;

export const validationCheckSchema = z.object({
  id: z.enum(VALIDATION_CHECKS),
  label: z.string(),
  /** null: not run because an earlier check failed. */
  passed: z.boolean().nullable(),
  messages: z.array(validationMessageSchema),
});
export type ValidationCheck = z.infer<typeof validationCheckSchema>;

const gumSummarySchema = z.object({
  y: z.number(),
  u: z.number(),
  U: z.number(),
  k: z.number(),
  nuEff: z.union([z.number(), z.literal('infinite'), z.null()]),
  unit: z.string(),
});

/** What validation recorded: enough to show later what was checked, with what, by whom and when. */
export const validationRecordSchema = z.object({
  purpose: z.enum(['dry-run', 'release']),
  passed: z.boolean(),
  engineVersion: z.string(),
  checkedAt: z.string(),
  checkedBy: personSchema,
  checks: z.array(validationCheckSchema),
  /** Input estimates used at the defaults (symbol → value in the input's unit). */
  inputs: z.record(z.string(), z.number()),
  /** GUM result at the defaults; null when the model could not be evaluated. */
  result: gumSummarySchema.nullable(),
  /** The reference case: its inputs, what was expected and what the engine gave. */
  referenceCase: z
    .object({
      source: z.string(),
      inputs: z.record(z.string(), z.number()),
      expected: z.object({ y: z.number(), u: z.number() }),
      obtained: z.object({ y: z.number(), u: z.number() }).nullable(),
      tolerance: z.object({ y: z.number(), uRel: z.number() }),
    })
    .nullable(),
  warnings: z.array(z.string()),
});
export type ValidationRecord = z.infer<typeof validationRecordSchema>;

export const templateVersionSchema = z.object({
  id: z.string(),
  templateId: z.string(),
  key: z.string().nullable(),
  version: z.number().int(),
  status: templateStatusSchema,
  definition: templateDefinitionSchema,
  createdBy: personSchema.nullable(),
  createdAt: z.string(),
  updatedBy: personSchema.nullable(),
  updatedAt: z.string(),
  releasedBy: personSchema.nullable(),
  releasedAt: z.string().nullable(),
  retiredAt: z.string().nullable(),
  validation: validationRecordSchema.nullable(),
});
export type TemplateVersion = z.infer<typeof templateVersionSchema>;

export const templateVersionRefSchema = z.object({
  id: z.string(),
  version: z.number().int(),
  status: templateStatusSchema,
  updatedAt: z.string(),
  releasedAt: z.string().nullable(),
  retiredAt: z.string().nullable(),
});
export type TemplateVersionRef = z.infer<typeof templateVersionRefSchema>;

/** One row of the template list: the template, its latest version and every version's state. */
export const templateSummarySchema = z.object({
  id: z.string(),
  key: z.string().nullable(),
  name: z.string(),
  summary: z.string().nullable(),
  measurand: z.object({ symbol: z.string(), unit: z.string().nullable() }),
  createdAt: z.string(),
  latest: templateVersionRefSchema,
  versions: z.array(templateVersionRefSchema),
});
export type TemplateSummary = z.infer<typeof templateSummarySchema>;

export const templateListResponseSchema = z.object({ templates: z.array(templateSummarySchema) });
export const templateVersionResponseSchema = z.object({ version: templateVersionSchema });
export const validationResponseSchema = z.object({ validation: validationRecordSchema });

/** POST /api/templates: a name (a starter draft is made), or a whole definition. */
export const createTemplateInputSchema = z
  .object({ definition: templateDefinitionSchema.optional(), name: templateDefinitionObjectSchema.shape.name.optional() })
  .strict()
  .refine((b) => (b.definition === undefined) !== (b.name === undefined), { message: 'give either a name (a starter draft is made) or a whole definition' });
export type CreateTemplateInput = z.infer<typeof createTemplateInputSchema>;

/** PUT /api/templates/versions/:id (drafts only). */
export const updateDraftInputSchema = z.object({ definition: templateDefinitionSchema }).strict();
export type UpdateDraftInput = z.infer<typeof updateDraftInputSchema>;

/** The draft a new template starts from: one input, one equation, to be replaced by the author. */
export function starterDefinition(name: string): TemplateDefinition {
  return {
    name,
    measurand: { symbol: 'y', unit: 'K', description: 'the measurand (describe it)' },
    equations: ['y = x'],
    inputs: [
      { symbol: 'x', unit: 'K', description: 'an input quantity (describe it)', source: 'entered', distribution: { type: 'normal', mean: 0, sd: 0.1 } },
    ],
    certificate: { resultLabel: name, methodStatement: 'Describe the calibration method as the certificate should state it.' },
  } as TemplateDefinition;
}
