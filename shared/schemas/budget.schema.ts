/**
 * The budget document: one contract for the engine, the API, the CLI and the database JSON.
 * A template is a budget document whose inputs carry definitions and defaults; a calibration
 * point's budget is the same document filled in.
 *
 * Distribution types follow JCGM 101:2008 §6.4. Conventions (also in the user guide):
 * - Degrees of freedom: an input's own `dof` wins; otherwise `readings` give n − 1, `student-t`
 *   its `dof`, every other distribution ∞ (`dof` omitted or null means ∞).
 * - Correlations are allowed between `normal` inputs only (sampled jointly, JCGM 101 §6.4.8).
 */
import { z } from 'zod';

const finite = (what: string) =>
  z.number({ error: `${what} must be a number` }).refine(Number.isFinite, { message: `${what} must be a finite number` });
const positive = (what: string) => finite(what).refine((v) => v > 0, { message: `${what} must be greater than zero` });
const nonNegative = (what: string) => finite(what).refine((v) => v >= 0, { message: `${what} must not be negative` });

/** An identifier usable in the model language: a letter, then letters, digits or underscores. */
export const symbolSchema = z
  .string({ error: 'symbol must be a string' })
  .regex(/^[A-Za-z][A-Za-z0-9_]*$/, { message: 'symbol must start with a letter and contain only letters, digits and _' })
  .max(64, { message: 'symbol must be at most 64 characters' });

const unitSchema = z.string({ error: 'unit must be a string' }).max(64, { message: 'a unit must be at most 64 characters' });
const descriptionSchema = z.string({ error: 'description must be a string' }).max(500, { message: 'a description must be at most 500 characters' });

const minMax = <T extends { min: number; max: number }>(v: T) => v.min < v.max;
const minMaxMessage = { message: 'min must be less than max', path: ['max'] };

/** Normal with its standard deviation, or with an expanded uncertainty and its coverage factor. */
type NormalBySd = { type: 'normal'; mean: number; sd: number };
type NormalByExpanded = { type: 'normal'; mean: number; expanded: number; k: number };
/** Rectangular by its limits, or by its centre and half-width. */
type RectangularByLimits = { type: 'rectangular'; min: number; max: number };
type RectangularByHalfWidth = { type: 'rectangular'; mean: number; halfWidth: number };

/**
 * One object schema per distribution type, so the distribution union is discriminated on `type`:
 * a document is checked against its own type only, and a mistake is reported on the field that
 * is wrong (a plain union tries every type in turn and, when none fits, can only say that none
 * does). Normal and rectangular each accept two parameter sets; the check names the set that is
 * incomplete or mixed.
 */
function oneParameterSet(type: string, sets: ReadonlyArray<readonly string[]>) {
  return (v: Record<string, unknown>, ctx: z.RefinementCtx) => {
    // The parameter sets of which at least one key is given, each with the keys given.
    const used = sets.map((set) => ({ set, given: set.filter((key) => v[key] !== undefined) })).filter((u) => u.given.length > 0);
    const describe = (set: readonly string[]) => set.join(' and ');
    const expected = sets.map(describe).join(', or ');
    if (used.length === 1) {
      const { set } = used[0];
      for (const key of set) {
        if (v[key] === undefined) ctx.addIssue({ code: 'custom', message: `${type} given by ${describe(set)} also needs ${key}`, path: [key] });
      }
      return;
    }
    ctx.addIssue({
      code: 'custom',
      message: used.length === 0 ? `${type} needs ${expected}` : `${type} takes either ${expected}, not both`,
      path: used.length === 0 ? [] : [used[1].given[0]],
    });
  };
}

const normalObject = z
  .object({ type: z.literal('normal'), mean: finite('mean'), sd: nonNegative('sd').optional(), expanded: nonNegative('expanded').optional(), k: positive('k').optional() })
  .strict()
  .superRefine(oneParameterSet('normal', [['sd'], ['expanded', 'k']]));
const rectangularObject = z
  .object({ type: z.literal('rectangular'), min: finite('min').optional(), max: finite('max').optional(), mean: finite('mean').optional(), halfWidth: positive('halfWidth').optional() })
  .strict()
  .superRefine(oneParameterSet('rectangular', [['min', 'max'], ['mean', 'halfWidth']]))
  .refine((v) => v.min === undefined || v.max === undefined || v.min < v.max, minMaxMessage);
/** The schemas check one object per type; their output types keep the two parameter sets apart. */
export const normalSchema = normalObject as unknown as z.ZodType<NormalBySd | NormalByExpanded>;
export const rectangularSchema = rectangularObject as unknown as z.ZodType<RectangularByLimits | RectangularByHalfWidth>;
export const triangularSchema = z
  .object({ type: z.literal('triangular'), min: finite('min'), max: finite('max'), mode: finite('mode').optional() })
  .strict()
  .refine(minMax, minMaxMessage)
  .refine((v) => v.mode === undefined || (v.mode >= v.min && v.mode <= v.max), { message: 'mode must lie between min and max', path: ['mode'] });
export const arcsineSchema = z.object({ type: z.literal('arcsine'), min: finite('min'), max: finite('max') }).strict().refine(minMax, minMaxMessage);
export const trapezoidalSchema = z
  .object({ type: z.literal('trapezoidal'), min: finite('min'), max: finite('max'), beta: finite('beta') })
  .strict()
  .refine(minMax, minMaxMessage)
  .refine((v) => v.beta >= 0 && v.beta <= 1, { message: 'beta (top width / base width) must lie between 0 and 1', path: ['beta'] });
export const curvilinearTrapezoidSchema = z
  .object({ type: z.literal('curvilinear-trapezoid'), min: finite('min'), max: finite('max'), d: nonNegative('d') })
  .strict()
  .refine(minMax, minMaxMessage)
  .refine((v) => v.d <= (v.max - v.min) / 2, { message: 'd must not exceed half the width (max − min)/2', path: ['d'] });
export const studentTSchema = z
  .object({ type: z.literal('student-t'), mean: finite('mean'), scale: nonNegative('scale'), dof: positive('dof') })
  .strict();
export const readingsSchema = z
  .object({
    type: z.literal('readings'),
    values: z.array(finite('each reading'), { error: 'values must be an array of numbers' }).min(2, { message: 'at least two readings are needed for a Type A evaluation' }),
  })
  .strict();
export const exponentialSchema = z.object({ type: z.literal('exponential'), mean: positive('mean') }).strict();
export const gammaSchema = z.object({ type: z.literal('gamma'), shape: positive('shape'), scale: positive('scale') }).strict();
export const constantSchema = z.object({ type: z.literal('constant'), value: finite('value') }).strict();

export const DISTRIBUTION_TYPES = [
  'normal', 'rectangular', 'triangular', 'arcsine', 'trapezoidal', 'curvilinear-trapezoid',
  'student-t', 'readings', 'exponential', 'gamma', 'constant',
] as const;
export type DistributionType = (typeof DISTRIBUTION_TYPES)[number];

export type Distribution =
  | NormalBySd | NormalByExpanded | RectangularByLimits | RectangularByHalfWidth
  | z.infer<typeof triangularSchema> | z.infer<typeof arcsineSchema> | z.infer<typeof trapezoidalSchema>
  | z.infer<typeof curvilinearTrapezoidSchema> | z.infer<typeof studentTSchema> | z.infer<typeof readingsSchema>
  | z.infer<typeof exponentialSchema> | z.infer<typeof gammaSchema> | z.infer<typeof constantSchema>;

export const distributionSchema = z.discriminatedUnion(
  'type',
  [
    normalObject, rectangularObject, triangularSchema, arcsineSchema, trapezoidalSchema,
    curvilinearTrapezoidSchema, studentTSchema, readingsSchema, exponentialSchema, gammaSchema, constantSchema,
  ],
  {
    error: (issue) =>
      issue.code === 'invalid_union'
        ? `distribution type must be one of: ${DISTRIBUTION_TYPES.join(', ')}`
        : 'distribution must be an object with a type and its parameters',
  },
) as unknown as z.ZodType<Distribution>;

export const inputSchema = z
  .object({
    symbol: symbolSchema,
    unit: unitSchema.optional(),
    description: descriptionSchema.optional(),
    distribution: distributionSchema,
    /** Degrees of freedom for the GUM; omitted or null means infinite. */
    dof: positive('dof').nullable().optional(),
  })
  .passthrough();
export type BudgetInput = z.infer<typeof inputSchema>;

export const correlationSchema = z
  .object({
    between: z.tuple([symbolSchema, symbolSchema], { error: 'between must name two input symbols' }),
    r: finite('r').refine((r) => r >= -1 && r <= 1, { message: 'r must lie between −1 and 1' }),
  })
  .strict()
  .refine((c) => c.between[0] !== c.between[1], { message: 'a correlation needs two different inputs', path: ['between'] });
export type Correlation = z.infer<typeof correlationSchema>;

export const monteCarloSchema = z
  .object({
    trials: z.number({ error: 'trials must be a number' }).int({ message: 'trials must be a whole number' }).min(1000, { message: 'trials must be at least 1000' }).max(100_000_000, { message: 'trials must be at most 10^8' }).optional(),
    seed: z.number({ error: 'seed must be a number' }).int({ message: 'seed must be a whole number' }).min(0, { message: 'seed must not be negative' }).max(2 ** 32 - 1, { message: 'seed must be at most 2^32 − 1' }).optional(),
    adaptive: z.boolean({ error: 'adaptive must be true or false' }).optional(),
    interval: z.enum(['shortest', 'symmetric'], { error: 'interval must be "shortest" or "symmetric"' }).optional(),
    /** Significant digits of u(y) for the numerical tolerance (JCGM 101 §7.9.2, §8). */
    digits: z.number({ error: 'digits must be a number' }).int({ message: 'digits must be a whole number' }).min(1, { message: 'digits must be 1, 2 or 3' }).max(3, { message: 'digits must be 1, 2 or 3' }).optional(),
  })
  .strict();

export const measurandSchema = z
  .object({ symbol: symbolSchema, unit: unitSchema.optional(), description: descriptionSchema.optional() })
  .strict();

export const budgetObjectSchema = z
  .object({
    measurand: measurandSchema.optional(),
    equations: z
      .array(z.string().min(1, { message: 'an equation must not be empty' }).max(10_000, { message: 'an equation must be at most 10 000 characters' }), { error: 'equations must be an array of strings' })
      .min(1, { message: 'at least one equation is needed' })
      .max(100, { message: 'at most 100 equations are accepted' }),
    constants: z.record(symbolSchema, finite('constant'), { error: 'constants must map symbols to numbers' }).optional(),
    /** Units of the constants, by symbol (used by the dimensional check only). */
    constantUnits: z.record(symbolSchema, z.string().max(64, { message: 'a unit must be at most 64 characters' })).optional(),
    inputs: z.array(inputSchema, { error: 'inputs must be an array of input quantities' }).min(1, { message: 'at least one input quantity is needed' }).max(200, { message: 'at most 200 input quantities are accepted' }),
    correlations: z.array(correlationSchema, { error: 'correlations must be an array' }).optional(),
    coverage: finite('coverage').refine((p) => p > 0 && p < 1, { message: 'coverage must lie strictly between 0 and 1' }).optional(),
    monteCarlo: monteCarloSchema.optional(),
    /** Report U to one or two significant digits (default 2). */
    reportDigits: z.union([z.literal(1), z.literal(2)], { error: 'reportDigits must be 1 or 2' }).optional(),
  })
  .passthrough();

/** Cross-field checks of a budget document (duplicate symbols, correlations). */
export function checkBudgetConsistency(doc: z.infer<typeof budgetObjectSchema>, ctx: z.RefinementCtx): void {
  {
    const seen = new Set<string>();
    doc.inputs.forEach((input, i) => {
      if (seen.has(input.symbol)) ctx.addIssue({ code: 'custom', message: `input symbol "${input.symbol}" is defined twice`, path: ['inputs', i, 'symbol'] });
      seen.add(input.symbol);
    });
    for (const name of Object.keys(doc.constants ?? {})) {
      if (seen.has(name)) ctx.addIssue({ code: 'custom', message: `"${name}" is both a constant and an input`, path: ['constants', name] });
    }
    const byName = new Map(doc.inputs.map((input) => [input.symbol, input]));
    (doc.correlations ?? []).forEach((c, i) => {
      for (const s of c.between) {
        const input = byName.get(s);
        if (!input) ctx.addIssue({ code: 'custom', message: `correlation names "${s}", which is not an input`, path: ['correlations', i, 'between'] });
        else if (input.distribution.type !== 'normal' && c.r !== 0)
          ctx.addIssue({ code: 'custom', message: `correlation with "${s}" is refused: correlations are allowed between normal inputs only (JCGM 101 §6.4.8)`, path: ['correlations', i, 'between'] });
      }
    });
  }
}

export const budgetSchema = budgetObjectSchema.superRefine(checkBudgetConsistency);

export type BudgetDocument = z.infer<typeof budgetSchema>;

/** Defaults of DESIGN.md: coverage 0.9545, 10^6 trials, non-adaptive, shortest interval. */
export const BUDGET_DEFAULTS = { coverage: 0.9545, trials: 1_000_000, adaptive: false, interval: 'shortest' as const, digits: 2, reportDigits: 2 as const };
