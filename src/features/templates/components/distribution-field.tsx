import { formatUnit } from '../../../../shared/format/units';
import type { Distribution } from '../../../../shared/schemas/budget.schema';
import { fromDisplay, POSITION_KEYS, toDisplay, WIDTH_KEYS } from '../../budgets/components/units';
import { NumberInput } from './number-input';

/** Ways to state an input's default distribution (JCGM 101 §6.4), with their parameters. */
const FORMS = [
  { id: 'normal-sd', label: 'Normal (standard deviation)', type: 'normal', params: ['mean', 'sd'] },
  { id: 'normal-expanded', label: 'Normal (expanded U and k)', type: 'normal', params: ['mean', 'expanded', 'k'] },
  { id: 'rectangular-half', label: 'Rectangular (centre ± half-width)', type: 'rectangular', params: ['mean', 'halfWidth'] },
  { id: 'rectangular-limits', label: 'Rectangular (limits)', type: 'rectangular', params: ['min', 'max'] },
  { id: 'triangular', label: 'Triangular', type: 'triangular', params: ['min', 'max', 'mode'] },
  { id: 'arcsine', label: 'Arcsine (U-shaped)', type: 'arcsine', params: ['min', 'max'] },
  { id: 'trapezoidal', label: 'Trapezoidal', type: 'trapezoidal', params: ['min', 'max', 'beta'] },
  { id: 'curvilinear-trapezoid', label: 'Trapezoid with inexact limits', type: 'curvilinear-trapezoid', params: ['min', 'max', 'd'] },
  { id: 'student-t', label: 'Student t', type: 'student-t', params: ['mean', 'scale', 'dof'] },
  { id: 'readings', label: 'Repeated readings (Type A)', type: 'readings', params: ['values'] },
  { id: 'exponential', label: 'Exponential', type: 'exponential', params: ['mean'] },
  { id: 'gamma', label: 'Gamma', type: 'gamma', params: ['shape', 'scale'] },
  { id: 'constant', label: 'Exact value (no uncertainty)', type: 'constant', params: ['value'] },
] as const;
type FormId = (typeof FORMS)[number]['id'];

const PARAM_LABELS: Record<string, string> = {
  mean: 'centre', sd: 'sd', expanded: 'U', k: 'k', halfWidth: 'half-width a', min: 'lower', max: 'upper', mode: 'mode (optional)',
  beta: 'β (top/base)', d: 'd', scale: 'scale', dof: 'ν', values: 'readings', shape: 'shape', value: 'value',
};

export function formOf(d: Distribution): FormId {
  if (d.type === 'normal') return 'expanded' in d ? 'normal-expanded' : 'normal-sd';
  if (d.type === 'rectangular') return 'halfWidth' in d ? 'rectangular-half' : 'rectangular-limits';
  return d.type as FormId;
}

/** The estimate of a distribution, to carry over when its form changes. */
function centre(d: Distribution): number {
  switch (d.type) {
    case 'normal': case 'student-t': case 'exponential': return d.mean;
    case 'rectangular': return 'mean' in d ? d.mean : (d.min + d.max) / 2;
    case 'triangular': case 'arcsine': case 'trapezoidal': case 'curvilinear-trapezoid': return (d.min + d.max) / 2;
    case 'readings': return d.values.reduce((a, b) => a + b, 0) / d.values.length;
    case 'gamma': return d.shape * d.scale;
    case 'constant': return d.value;
  }
}

function starter(form: FormId, c: number): Distribution {
  const w = Math.abs(c) > 0 ? Math.abs(c) * 0.01 : 0.1;
  switch (form) {
    case 'normal-sd': return { type: 'normal', mean: c, sd: w };
    case 'normal-expanded': return { type: 'normal', mean: c, expanded: 2 * w, k: 2 };
    case 'rectangular-half': return { type: 'rectangular', mean: c, halfWidth: w };
    case 'rectangular-limits': return { type: 'rectangular', min: c - w, max: c + w };
    case 'triangular': return { type: 'triangular', min: c - w, max: c + w };
    case 'arcsine': return { type: 'arcsine', min: c - w, max: c + w };
    case 'trapezoidal': return { type: 'trapezoidal', min: c - w, max: c + w, beta: 0.5 };
    case 'curvilinear-trapezoid': return { type: 'curvilinear-trapezoid', min: c - w, max: c + w, d: w / 10 };
    case 'student-t': return { type: 'student-t', mean: c, scale: w, dof: 10 };
    case 'readings': return { type: 'readings', values: [c, c] };
    case 'exponential': return { type: 'exponential', mean: c > 0 ? c : 1 };
    case 'gamma': return { type: 'gamma', shape: 2, scale: c > 0 ? c / 2 : 1 };
    case 'constant': return { type: 'constant', value: c };
  }
}

type Loose = Record<string, unknown>;

/**
 * Distribution type and its parameters, in one table cell. Parameters carrying the input's unit
 * are shown and typed in the unit people see (`shownAs`, e.g. °C or µm) and kept in SI (`unit`),
 * positions with the offset and widths without, as in the budget editor. An unknown or incompatible
 * `shownAs` (still being typed, say) leaves them in SI.
 */
export function DistributionField({ value, onChange, label, errors, unit, shownAs }: { value: Distribution; onChange: (d: Distribution) => void; label: string; errors?: Record<string, string>; unit?: string; shownAs?: string }) {
  const form = FORMS.find((f) => f.id === formOf(value))!;
  const v = value as unknown as Loose;
  let shown = unit;
  if (shownAs) {
    try {
      toDisplay('mean', 0, unit, shownAs); // throws for a unit it cannot convert to (one still being typed, say)
      shown = shownAs;
    } catch {
      // stays SI
    }
  }
  // 12 significant digits: a value typed in °C comes back from kelvin without binary noise, so the field does not rewrite it.
  const display = (p: string, n: number | undefined) => (n === undefined || !Number.isFinite(n) ? n : Number(toDisplay(p, n, unit, shown).toPrecision(12)));
  const store = (p: string, n: number | undefined) => (n === undefined || !Number.isFinite(n) ? n : fromDisplay(p, n, unit, shown));
  const unitOf = (p: string) => {
    const u = shown ? formatUnit(shown) : '';
    return (POSITION_KEYS.has(p) || WIDTH_KEYS.has(p) || p === 'values') && u && u !== '1' ? ` (${u})` : '';
  };
  return (
    <div className="flex flex-col gap-1">
      <select
        aria-label={`${label}: distribution`}
        value={form.id}
        onChange={(e) => onChange(starter(e.target.value as FormId, centre(value)))}
        className="rounded-field border border-line-strong bg-surface px-1 py-1 text-sm"
      >
        {FORMS.map((f) => (
          <option key={f.id} value={f.id}>{f.label}</option>
        ))}
      </select>
      <div className="grid grid-cols-[max-content_1fr] items-center gap-x-2 gap-y-1">
        {form.params.map((p) => (
          <label key={p} className="contents text-xs text-ink-muted">
            <span>{PARAM_LABELS[p]}{unitOf(p)}</span>
            {p === 'values' ? (
              <ReadingsInput
                key={shown}
                values={((v.values as number[]) ?? []).map((x) => display('mean', x) as number)}
                onChange={(values) => onChange({ ...(v as object), values: values.map((x) => store('mean', x) as number) } as Distribution)}
                label={`${label}: readings`}
                invalid={!!errors?.values}
              />
            ) : (
              <NumberInput
                aria-label={`${label}: ${PARAM_LABELS[p]}`}
                value={display(p, v[p] as number | undefined)}
                invalid={!!errors?.[p]}
                onChange={(input) => {
                  const n = store(p, input);
                  const next: Loose = { ...v, [p]: n };
                  if (n === undefined) delete next[p];
                  onChange(next as unknown as Distribution);
                }}
              />
            )}
          </label>
        ))}
      </div>
      {errors && Object.values(errors).map((m) => (
        <p key={m} className="text-xs font-medium text-danger"><span aria-hidden="true">✕ </span>{m}</p>
      ))}
    </div>
  );
}

function ReadingsInput({ values, onChange, label, invalid }: { values: number[]; onChange: (v: number[]) => void; label: string; invalid: boolean }) {
  return (
    <textarea
      aria-label={label}
      defaultValue={values.join(' ')}
      rows={2}
      onBlur={(e) => onChange(e.target.value.split(/[\s,;]+/).filter(Boolean).map(Number))}
      className={`w-full rounded-field border bg-surface px-2 py-1 font-mono text-xs ${invalid ? 'border-danger' : 'border-line-strong'}`}
    />
  );
}
