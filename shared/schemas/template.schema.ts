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
