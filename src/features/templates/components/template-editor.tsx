import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { Controller, get, useFieldArray, useForm, useWatch, type Control, type FieldErrors, type FieldPath } from 'react-hook-form';
import type { z } from 'zod';
import { checkEquations, checkUnits, type EquationIssue } from '../../../../shared/engine';
import {
  budgetFromTemplate,
  DECISION_RULES,
  INPUT_SOURCE_LABELS,
  INPUT_SOURCES,
  templateDefinitionSchema,
  type TemplateDefinition,
} from '../../../../shared/schemas/template.schema';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { cn } from '../../../lib/cn';
import { BudgetPreview } from './budget-preview';
import { DistributionField } from './distribution-field';
import { EquationField } from './equation-field';
import { NumberInput } from './number-input';
import { useDebounced } from '../../../lib/use-debounced';

type FormValues = z.input<typeof templateDefinitionSchema>;
type Path = FieldPath<FormValues>;

const DECISION_RULE_LABELS: Record<(typeof DECISION_RULES)[number], string> = {
  none: 'No conformity statement',
  simple: 'Simple acceptance (ILAC-G8 §4.2.1)',
  'guard-band': 'Guard band w = U (ILAC-G8 §4.2.2)',
};

/** Short words for the select; the full wording (INPUT_SOURCE_LABELS) is the option's title. */
const SOURCE_SHORT: Record<(typeof INPUT_SOURCES)[number], string> = {
  readings: 'Readings (Type A)',
  reference: 'Reference standard',
  fixed: 'Fixed by the method',
  entered: 'Entered (Type B)',
};

const field = 'rounded-field border bg-surface px-2 py-1 text-sm text-ink';
const errorText = (errors: FieldErrors<FormValues>, path: string): string | undefined => {
  const e = get(errors, path) as { message?: unknown; root?: { message?: unknown } } | undefined;
  if (!e) return undefined;
  if (typeof e.message === 'string' && e.message) return e.message;
  const root = e.root?.message;
  return typeof root === 'string' ? root : undefined;
};

function Section({ title, id, children, aside }: { title: string; id: string; children: ReactNode; aside?: ReactNode }) {
  return (
    <section aria-labelledby={id} className="min-w-0 rounded-card border border-line bg-surface px-5 py-4 shadow-card">
      <div className="mb-3 flex items-baseline justify-between gap-4">
        <h2 id={id} className="text-base font-semibold text-ink">{title}</h2>
        {aside}
      </div>
      {children}
    </section>
  );
}

function Field({ label, error, children, hint, className }: { label: string; error?: string; hint?: string; children: ReactNode; className?: string }) {
  return (
    <label className={cn('flex flex-col gap-1 text-sm', className)}>
      <span className="font-semibold text-ink">{label}</span>
      {children}
      {hint && <span className="text-xs text-ink-muted">{hint}</span>}
      {error && <span className="text-xs font-medium text-danger"><span aria-hidden="true">✕ </span>{error}</span>}
    </label>
  );
}

function NumField({ control, name, label, optional }: { control: Control<FormValues>; name: Path; label: string; optional?: boolean }) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field: f, fieldState }) => (
        <NumberInput aria-label={label} value={f.value as number | undefined} onChange={(v) => f.onChange(v === undefined && !optional ? Number.NaN : v)} onBlur={f.onBlur} invalid={!!fieldState.error} />
      )}
    />
  );
}

/** Lines of a textarea ↔ an array of strings (sources, certificate statements). */
function LinesField({ control, name, label, rows = 3 }: { control: Control<FormValues>; name: Path; label: string; rows?: number }) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field: f }) => (
        <textarea
          aria-label={label}
          rows={rows}
          className={cn(field, 'border-line-strong')}
          defaultValue={((f.value as string[] | undefined) ?? []).join('\n')}
          onBlur={(e) => {
            const lines = e.target.value.split('\n').map((l) => l.trim()).filter(Boolean);
            f.onChange(lines.length ? lines : undefined);
            f.onBlur();
          }}
        />
      )}
    />
  );
}

/** First problem of each equation, from the engine's allow-list check (runs in the browser). */
export function useEquationIssues(equations: readonly string[], known: readonly string[]): { byEquation: Map<number, EquationIssue>; all: EquationIssue[] } {
  return useMemo(() => {
    const r = checkEquations(equations.map((e) => e ?? ''), known);
    const byEquation = new Map<number, EquationIssue>();
    for (const e of r.errors) if (!byEquation.has(e.equation)) byEquation.set(e.equation, e);
    return { byEquation, all: r.errors };
  }, [equations, known]);
}

/** The form's id: a save button outside the form (the page's action bar) submits it with form={…}. */
export const TEMPLATE_FORM_ID = 'template-form';

export interface TemplateEditorProps {
  definition: TemplateDefinition;
  readOnly: boolean;
  saving?: boolean;
  onSave?: (definition: TemplateDefinition) => void;
  onDirtyChange?: (dirty: boolean) => void;
  /** Shown above the form (save errors from the server). */
  banner?: ReactNode;
}

/** The template form: every part of a measurement model, checked live, with the GUM preview. */
export function TemplateEditor({ definition, readOnly, saving, onSave, onDirtyChange, banner }: TemplateEditorProps) {
  const form = useForm<FormValues, unknown, TemplateDefinition>({
    resolver: zodResolver(templateDefinitionSchema),
    defaultValues: withFormDefaults(definition),
    mode: 'onChange',
  });
  const { control, register, handleSubmit, formState, setValue, reset } = form;
  const { errors } = formState;
  const [invalidCount, setInvalidCount] = useState(0);

  useEffect(() => {
    reset(withFormDefaults(definition));
  }, [definition, reset]);

  // The schema's passthrough objects defeat react-hook-form's array-path typing: a narrower view.
  const arrays = control as unknown as Control<{ inputs: Array<Record<string, unknown>>; cmc: { rows: Array<Record<string, unknown>> } }>;
  const inputs = useFieldArray({ control: arrays, name: 'inputs' });
  const cmcRows = useFieldArray({ control: arrays, name: 'cmc.rows' });
  const values = useWatch({ control }) as FormValues;
  const settled = useDebounced(values, 250);
  // react-hook-form counts a registered-but-absent optional field (undefined) as a change; compare
  // the documents as JSON instead, which is what is saved.
  const baseline = useMemo(() => stableJson(withFormDefaults(definition)), [definition]);
  const isDirty = useMemo(() => stableJson(values) !== baseline, [values, baseline]);
  useEffect(() => onDirtyChange?.(isDirty), [isDirty, onDirtyChange]);

  const equations = useMemo(() => (settled.equations ?? []) as string[], [settled.equations]);
  const known = useMemo(
    () => [...(settled.inputs ?? []).map((i) => i?.symbol ?? '').filter(Boolean), ...Object.keys(settled.constants ?? {})],
    [settled.inputs, settled.constants],
  );
  const issues = useEquationIssues(equations, known);

  const parsed = useMemo(() => templateDefinitionSchema.safeParse(settled), [settled]);
  const valid = parsed.success ? parsed.data : null;
  const unitCheck = useMemo(() => (valid && issues.all.length === 0 ? checkUnits(budgetFromTemplate(valid)) : null), [valid, issues.all.length]);
  const previewDefinition = valid && issues.all.length === 0 ? valid : null;

  const liveEquations = (values.equations ?? []) as string[];
  const symbols = (values.inputs ?? []).map((i) => i?.symbol).filter(Boolean) as string[];

  const submit = handleSubmit(
    (d) => {
      setInvalidCount(0);
      onSave?.(d);
    },
    (errs) => setInvalidCount(countErrors(errs)),
  );

  return (
    <form id={TEMPLATE_FORM_ID} onSubmit={submit} noValidate aria-label="Measurement model" className="min-w-0 space-y-4">
      {banner}
      {invalidCount > 0 && (
        <Notice tone="danger" label="The draft was not saved" role="alert">
          {invalidCount === 1 ? 'One field needs attention; it is' : `${invalidCount} fields need attention; they are`} marked below. Everything you typed is still here.
        </Notice>
      )}
      <fieldset disabled={readOnly} className="min-w-0 space-y-4">
        <div className="grid gap-4 lg:grid-cols-2">
          <Section title="Model" id="sec-general">
            <div className="space-y-3">
              <Field label="Name" error={errorText(errors, 'name')}>
                <input {...register('name')} className={cn(field, errors.name ? 'border-danger' : 'border-line-strong')} />
              </Field>
              <Field label="Summary" error={errorText(errors, 'summary')} hint="One sentence shown in the list of models.">
                <input {...register('summary', { setValueAs: (v: string) => (v === '' ? undefined : v) })} className={cn(field, 'border-line-strong')} />
              </Field>
              <Field label="Description and published sources" error={errorText(errors, 'description')}>
                <textarea {...register('description', { setValueAs: (v: string) => (v === '' ? undefined : v) })} rows={4} className={cn(field, 'border-line-strong')} />
              </Field>
              <Field label="Sources, one per line">
                <LinesField control={control} name="sources" label="Sources, one per line" />
              </Field>
            </div>
          </Section>
          <Section title="Measurand" id="sec-measurand">
            <div className="grid grid-cols-[8rem_8rem] gap-3">
              <Field label="Symbol" error={errorText(errors, 'measurand.symbol')}>
                <input {...register('measurand.symbol')} spellCheck={false} className={cn(field, 'font-mono', errors.measurand?.symbol ? 'border-danger' : 'border-line-strong')} />
              </Field>
              <Field label="Unit (SI)" error={errorText(errors, 'measurand.unit')}>
                <input {...register('measurand.unit', { setValueAs: (v: string) => (v === '' ? undefined : v) })} spellCheck={false} className={cn(field, 'font-mono border-line-strong')} />
              </Field>
            </div>
            <Field label="Description" error={errorText(errors, 'measurand.description')} className="mt-3">
              <input {...register('measurand.description')} className={cn(field, errors.measurand?.description ? 'border-danger' : 'border-line-strong')} />
            </Field>
            <Field label="Coverage probability p" className="mt-3 w-48" error={errorText(errors, 'coverage')} hint="0.9545 gives k ≈ 2 for a normal output.">
              <NumField control={control} name="coverage" label="Coverage probability p" optional />
            </Field>
          </Section>
        </div>

        <Section
          title="Model equations"
          id="sec-equations"
          aside={<span className="text-xs text-ink-muted">Evaluated in order; the last one defines the measurand. Checked as you type.</span>}
        >
          <ol className="space-y-3">
            {liveEquations.map((text, i) => (
              <EquationField
                key={i}
                index={i}
                text={text ?? ''}
                registration={register(`equations.${i}` as const)}
                issue={equations[i] === text ? issues.byEquation.get(i) : undefined}
                readOnly={readOnly}
                onRemove={liveEquations.length > 1 ? () => setValue('equations', liveEquations.filter((_, j) => j !== i), { shouldDirty: true, shouldValidate: true }) : undefined}
              />
            ))}
          </ol>
          {errorText(errors, 'equations') && <p className="mt-2 text-xs font-medium text-danger">{errorText(errors, 'equations')}</p>}
          {!readOnly && (
            <Button variant="secondary" className="mt-3" onClick={() => setValue('equations', [...liveEquations, ''], { shouldDirty: true })}>
              Add an equation
            </Button>
          )}
          <p className="mt-3 text-xs text-ink-muted">
            Symbols available: {symbols.length ? symbols.join(', ') : 'none yet'}; library constants c1L, c2, c2_its90, sigma, h, c0, kB; functions exp, log, log10, sqrt, abs, sin, cos, tan, asin, acos, atan, min, max, planck, planck_nu, planck_temperature, band_radiance, stefan_boltzmann, wien_peak, sh_signal, sh_temperature, its90_ratio.
          </p>
          {unitCheck && unitCheck.errors.length > 0 && (
            <Notice tone="danger" label="Units do not agree" className="mt-3">
              <ul className="list-disc pl-5">{unitCheck.errors.map((e) => <li key={e.message}>{e.message}</li>)}</ul>
            </Notice>
          )}
          {unitCheck && unitCheck.errors.length === 0 && unitCheck.warnings.length > 0 && (
            <Notice tone="warn" label="Units not fully checked" className="mt-3">
              <ul className="list-disc pl-5">{unitCheck.warnings.map((w) => <li key={w}>{w}</li>)}</ul>
            </Notice>
          )}
        </Section>

        <Section title="Input quantities" id="sec-inputs" aside={<span className="text-xs text-ink-muted">Defaults are what a new calibration point starts from.</span>}>
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-sm">
              <thead>
                <tr className="border-b border-line-strong text-left text-xs text-ink-muted">
                  <th scope="col" className="py-1 pr-2 font-semibold">Symbol</th>
                  <th scope="col" className="px-2 font-semibold">Unit (SI)</th>
                  <th scope="col" className="px-2 font-semibold">Shown as</th>
                  <th scope="col" className="px-2 font-semibold">Meaning</th>
                  <th scope="col" className="px-2 font-semibold">Value comes from</th>
                  <th scope="col" className="px-2 font-semibold">Default distribution</th>
                  <th scope="col" className="px-2 font-semibold">ν</th>
                  <th scope="col" className="pl-2"><span className="sr-only">Remove</span></th>
                </tr>
              </thead>
              <tbody>
                {inputs.fields.map((f, i) => {
                  const sym = values.inputs?.[i]?.symbol || `input ${i + 1}`;
                  const distErrors = collectLeafErrors(get(errors, `inputs.${i}.distribution`));
                  return (
                    <tr key={f.id} className="border-b border-line align-top">
                      <td className="py-1.5 pr-2">
                        <input aria-label={`Input ${i + 1}: symbol`} {...register(`inputs.${i}.symbol`)} spellCheck={false} className={cn(field, 'w-28 font-mono', get(errors, `inputs.${i}.symbol`) ? 'border-danger' : 'border-line-strong')} />
                        <CellError text={errorText(errors, `inputs.${i}.symbol`)} />
                      </td>
                      <td className="px-2 py-1.5">
                        <input aria-label={`${sym}: unit`} {...register(`inputs.${i}.unit`, { setValueAs: (v: string) => (v === '' ? undefined : v) })} spellCheck={false} className={cn(field, 'w-24 font-mono border-line-strong')} />
                      </td>
                      <td className="px-2 py-1.5">
                        <input aria-label={`${sym}: unit shown to people`} {...register(`inputs.${i}.displayUnit`, { setValueAs: (v: string) => (v === '' ? undefined : v) })} spellCheck={false} className={cn(field, 'w-16 font-mono border-line-strong')} />
                      </td>
                      <td className="px-2 py-1.5">
                        <textarea aria-label={`${sym}: meaning`} rows={3} {...register(`inputs.${i}.description`)} className={cn(field, 'w-60', get(errors, `inputs.${i}.description`) ? 'border-danger' : 'border-line-strong')} />
                        <CellError text={errorText(errors, `inputs.${i}.description`)} />
                      </td>
                      <td className="px-2 py-1.5">
                        <select aria-label={`${sym}: value comes from`} {...register(`inputs.${i}.source`)} className={cn(field, 'w-44 border-line-strong')}>
                          {INPUT_SOURCES.map((s) => <option key={s} value={s} title={INPUT_SOURCE_LABELS[s]}>{SOURCE_SHORT[s]}</option>)}
                        </select>
                        {values.inputs?.[i]?.source === 'reference' && (
                          <input aria-label={`${sym}: kind of reference standard`} placeholder="kind of standard" {...register(`inputs.${i}.referenceKind`, { setValueAs: (v: string) => (v === '' ? undefined : v) })} className={cn(field, 'mt-1 w-44 border-line-strong')} />
                        )}
                      </td>
                      <td className="w-72 px-2 py-1.5">
                        <Controller
                          control={control}
                          name={`inputs.${i}.distribution`}
                          render={({ field: d }) => <DistributionField label={sym} value={d.value as never} onChange={d.onChange} errors={distErrors} unit={values.inputs?.[i]?.unit} shownAs={values.inputs?.[i]?.displayUnit} />}
                        />
                      </td>
                      <td className="w-20 px-2 py-1.5">
                        <Controller
                          control={control}
                          name={`inputs.${i}.dof`}
                          render={({ field: d, fieldState }) => <NumberInput aria-label={`${sym}: degrees of freedom`} placeholder="∞" value={(d.value ?? undefined) as number | undefined} onChange={(v) => d.onChange(v)} invalid={!!fieldState.error} />}
                        />
                      </td>
                      <td className="py-1.5 pl-2">
                        {!readOnly && inputs.fields.length > 1 && (
                          <button type="button" onClick={() => inputs.remove(i)} className="rounded-field px-2 py-1 text-xs text-ink-muted hover:bg-sunken" aria-label={`Remove ${sym}`}>
                            Remove
                          </button>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          {!readOnly && (
            <Button
              variant="secondary"
              className="mt-3"
              onClick={() => inputs.append({ symbol: `x${inputs.fields.length + 1}`, unit: '', description: '', source: 'entered', distribution: { type: 'normal', mean: 0, sd: 0.1 } } as never)}
            >
              Add an input quantity
            </Button>
          )}
        </Section>

        <Section title="Budget at the defaults (GUM)" id="sec-preview" aside={<span className="text-xs text-ink-muted">JCGM 100 law of propagation, the same engine that computes stored results</span>}>
          <BudgetPreview definition={previewDefinition} />
        </Section>

        <div className="grid gap-4 lg:grid-cols-2">
          <Section title="CMC rows" id="sec-cmc" aside={<span className="text-xs text-ink-muted">Range → smallest U the laboratory may state</span>}>
            <div className="mb-2 flex gap-3">
              <Field label="Range of">
                <select {...register('cmc.basis', { setValueAs: (v: string) => (v === '' ? undefined : v) })} className={cn(field, 'border-line-strong')}>
                  <option value="">the measurand ({values.measurand?.symbol})</option>
                  {symbols.map((s) => <option key={s} value={s}>{s}</option>)}
                </select>
              </Field>
              <Field label="Unit of the range">
                <input {...register('cmc.unit', { setValueAs: (v: string) => (v === '' ? undefined : v) })} className={cn(field, 'w-24 font-mono border-line-strong')} />
              </Field>
            </div>
            <table className="w-full text-sm">
              <thead>
                <tr className="text-left text-xs text-ink-muted">
                  <th scope="col" className="font-semibold">From</th>
                  <th scope="col" className="font-semibold">To</th>
                  <th scope="col" className="font-semibold">Smallest U</th>
                  <th scope="col" className="font-semibold">Relative</th>
                  <th scope="col"><span className="sr-only">Remove</span></th>
                </tr>
              </thead>
              <tbody>
                {cmcRows.fields.map((f, i) => (
                  <tr key={f.id}>
                    <td className="py-1 pr-1"><NumField control={control} name={`cmc.rows.${i}.from` as Path} label={`CMC row ${i + 1}: from`} /></td>
                    <td className="py-1 pr-1"><NumField control={control} name={`cmc.rows.${i}.to` as Path} label={`CMC row ${i + 1}: to`} /></td>
                    <td className="py-1 pr-1"><NumField control={control} name={`cmc.rows.${i}.U` as Path} label={`CMC row ${i + 1}: smallest U`} /></td>
                    <td className="py-1 text-center"><input type="checkbox" aria-label={`CMC row ${i + 1}: U is relative`} {...register(`cmc.rows.${i}.relative` as Path)} /></td>
                    <td>{!readOnly && <button type="button" onClick={() => cmcRows.remove(i)} className="px-2 text-xs text-ink-muted" aria-label={`Remove CMC row ${i + 1}`}>Remove</button>}</td>
                  </tr>
                ))}
                {cmcRows.fields.map((_, i) => {
                  const m = collectLeafErrors(get(errors, `cmc.rows.${i}`));
                  return m && Object.keys(m).length ? (
                    <tr key={`e${i}`}><td colSpan={5}><CellError text={`Row ${i + 1}: ${Object.values(m).join('; ')}`} /></td></tr>
                  ) : null;
                })}
              </tbody>
            </table>
            {cmcRows.fields.length === 0 && <p className="text-sm text-ink-muted">No CMC rows: results will not be compared with a CMC.</p>}
            {!readOnly && (
              <Button variant="secondary" className="mt-2" onClick={() => cmcRows.append({ from: 0, to: 1, U: 0.1 } as never)}>
                Add a CMC row
              </Button>
            )}
          </Section>

          <Section title="Default decision rule" id="sec-decision">
            <div className="space-y-3">
              <Field label="Rule">
                <select {...register('decisionRule.kind')} className={cn(field, 'border-line-strong')}>
                  {DECISION_RULES.map((k) => <option key={k} value={k}>{DECISION_RULE_LABELS[k]}</option>)}
                </select>
              </Field>
              <Field label="Tolerance (± in the measurand's unit)" error={errorText(errors, 'decisionRule.tolerance')} className="w-64">
                <NumField control={control} name="decisionRule.tolerance" label="Tolerance" optional />
              </Field>
              <Field label="Statement on the certificate">
                <textarea rows={3} {...register('decisionRule.statement', { setValueAs: (v: string) => (v === '' ? undefined : v) })} className={cn(field, 'border-line-strong')} />
              </Field>
            </div>
          </Section>
        </div>

        <Section title="Certificate wording" id="sec-certificate">
          <div className="grid gap-3 lg:grid-cols-2">
            <Field label="What the results table calls the measurand" error={errorText(errors, 'certificate.resultLabel')}>
              <input {...register('certificate.resultLabel')} className={cn(field, get(errors, 'certificate.resultLabel') ? 'border-danger' : 'border-line-strong')} />
            </Field>
            <Field label="Further statements, one per line">
              <LinesField control={control} name="certificate.statements" label="Further statements, one per line" rows={2} />
            </Field>
            <Field label="Method statement" error={errorText(errors, 'certificate.methodStatement')} className="lg:col-span-2">
              <textarea rows={3} {...register('certificate.methodStatement')} className={cn(field, get(errors, 'certificate.methodStatement') ? 'border-danger' : 'border-line-strong')} />
            </Field>
          </div>
        </Section>

        <ReferenceCaseSection control={control} errors={errors} readOnly={readOnly} present={!!values.referenceCase} onAdd={() => setValue('referenceCase', { source: '', expected: { y: Number.NaN, u: Number.NaN }, tolerance: { yAbs: 0, uRel: 0.001 } } as never, { shouldDirty: true })} onRemove={() => setValue('referenceCase', undefined, { shouldDirty: true })} register={register} />
      </fieldset>

      {!readOnly && (
        <div className="flex items-center justify-end gap-3 border-t border-line px-1 py-3">
          <span className="text-sm text-ink-muted" role="status">{saving ? 'Saving…' : isDirty ? 'Unsaved changes' : 'All changes saved'}</span>
          <Button type="submit" disabled={saving}>Save draft</Button>
        </div>
      )}
    </form>
  );
}

function ReferenceCaseSection({ control, errors, readOnly, present, onAdd, onRemove, register }: {
  control: Control<FormValues>;
  errors: FieldErrors<FormValues>;
  readOnly: boolean;
  present: boolean;
  onAdd: () => void;
  onRemove: () => void;
  register: ReturnType<typeof useForm<FormValues, unknown, TemplateDefinition>>['register'];
}) {
  return (
    <Section title="Reference case" id="sec-reference" aside={<span className="text-xs text-ink-muted">Release reproduces it (ISO/IEC 17025 §7.2.2)</span>}>
      {!present ? (
        <div className="text-sm text-ink-muted">
          <p>No reference case yet. Release needs one: input values with the expected y and u(y) from an independent calculation or a published example.</p>
          {!readOnly && <Button variant="secondary" className="mt-2" onClick={onAdd}>Add a reference case</Button>}
        </div>
      ) : (
        <div className="grid gap-3 lg:grid-cols-[2fr_1fr]">
          <Field label="Where the expected values come from" error={errorText(errors, 'referenceCase.source')}>
            <textarea rows={3} {...register('referenceCase.source')} className={cn(field, get(errors, 'referenceCase.source') ? 'border-danger' : 'border-line-strong')} />
          </Field>
          <Field label="Input values that differ from the defaults" hint="One per line: symbol = value (SI).">
            <Controller
              control={control}
              name="referenceCase.inputs"
              render={({ field: f }) => (
                <textarea
                  aria-label="Reference case input values"
                  rows={3}
                  className={cn(field, 'font-mono border-line-strong')}
                  defaultValue={Object.entries((f.value as Record<string, number> | undefined) ?? {}).map(([k, v]) => `${k} = ${v}`).join('\n')}
                  onBlur={(e) => {
                    const entries = e.target.value.split('\n').map((l) => /^\s*([A-Za-z][A-Za-z0-9_]*)\s*=\s*(\S+)\s*$/.exec(l)).filter((m): m is RegExpExecArray => !!m).map((m) => [m[1], Number(m[2])] as const);
                    f.onChange(entries.length ? Object.fromEntries(entries) : undefined);
                  }}
                />
              )}
            />
          </Field>
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-5 lg:col-span-2">
            <Field label="Expected y" error={errorText(errors, 'referenceCase.expected.y')}><NumField control={control} name="referenceCase.expected.y" label="Expected y" /></Field>
            <Field label="Expected u(y)" error={errorText(errors, 'referenceCase.expected.u')}><NumField control={control} name="referenceCase.expected.u" label="Expected u(y)" /></Field>
            <Field label="Tolerance on y (absolute)" error={errorText(errors, 'referenceCase.tolerance.yAbs')}><NumField control={control} name="referenceCase.tolerance.yAbs" label="Tolerance on y (absolute)" optional /></Field>
            <Field label="Tolerance on y (relative)" error={errorText(errors, 'referenceCase.tolerance.yRel')}><NumField control={control} name="referenceCase.tolerance.yRel" label="Tolerance on y (relative)" optional /></Field>
            <Field label="Tolerance on u (relative)" error={errorText(errors, 'referenceCase.tolerance.uRel')}><NumField control={control} name="referenceCase.tolerance.uRel" label="Tolerance on u (relative)" /></Field>
          </div>
          {!readOnly && <div><Button variant="quiet" onClick={onRemove}>Remove the reference case</Button></div>}
        </div>
      )}
    </Section>
  );
}

/** The form always holds a decision rule and a CMC table (empty ones when the document has none). */
function withFormDefaults(d: TemplateDefinition): FormValues {
  return { ...d, decisionRule: d.decisionRule ?? { kind: 'none' }, cmc: d.cmc ?? { rows: [] } } as FormValues;
}

/** JSON with sorted keys and without undefined members, for comparing documents. */
function stableJson(v: unknown): string {
  return JSON.stringify(v, (_k, x) => (x && typeof x === 'object' && !Array.isArray(x) ? Object.fromEntries(Object.keys(x).sort().map((k) => [k, (x as Record<string, unknown>)[k]])) : x));
}

function CellError({ text }: { text?: string }) {
  if (!text) return null;
  return <p className="mt-0.5 max-w-56 text-xs font-medium text-danger"><span aria-hidden="true">✕ </span>{text}</p>;
}

/** Leaf messages of a nested error object, keyed by their last path segment. */
function collectLeafErrors(e: unknown): Record<string, string> | undefined {
  if (!e || typeof e !== 'object') return undefined;
  const out: Record<string, string> = {};
  const walk = (node: unknown, key: string) => {
    if (!node || typeof node !== 'object') return;
    const n = node as { message?: unknown; ref?: unknown };
    if (typeof n.message === 'string' && n.message) out[key] = n.message;
    for (const [k, v] of Object.entries(node)) if (k !== 'ref' && k !== 'message' && k !== 'type' && typeof v === 'object') walk(v, k);
  };
  walk(e, 'value');
  return Object.keys(out).length ? out : undefined;
}

function countErrors(errs: FieldErrors<FormValues>): number {
  let n = 0;
  const walk = (node: unknown) => {
    if (!node || typeof node !== 'object') return;
    const o = node as { message?: unknown };
    if (typeof o.message === 'string' && o.message) n += 1;
    for (const [k, v] of Object.entries(node)) if (k !== 'ref' && typeof v === 'object') walk(v);
  };
  walk(errs);
  return Math.max(1, n);
}
