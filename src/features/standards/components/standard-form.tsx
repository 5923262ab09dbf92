import { useState, type FormEvent } from 'react';
import {
  STANDARD_KIND_LABELS,
  STANDARD_KINDS,
  STANDARD_STATUS_LABELS,
  STANDARD_STATUSES,
  type StandardDetail,
  type StandardInput,
  type StandardKind,
  type StandardStatus,
} from '../../../../shared/schemas/standards.schema';
import type { ApiIssue } from '../../../../shared/schemas/api-error.schema';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/text-field';
import { ApiError } from '../../../lib/api-client';
import { useSaveStandard } from '../api/save-standard';

type Row = { id?: string; quantity: string; value: string; unit: string; U: string; k: string; atValue: string; atUnit: string };

const emptyRow = (): Row => ({ quantity: '', value: '', unit: '', U: '', k: '2', atValue: '', atUnit: '' });
const num = (s: string) => (s.trim() === '' ? Number.NaN : Number(s.trim().replace(/\s/g, '').replace(',', '.')));
const cell = 'w-full rounded-field border border-line-strong bg-surface px-2 py-1 text-sm';

/** Create or edit a reference standard with its certified values. */
export function StandardForm({ standard, onSaved }: { standard?: StandardDetail; onSaved: (s: StandardDetail) => void }) {
  const save = useSaveStandard(standard?.id);
  const [f, setF] = useState({
    name: standard?.name ?? '',
    kind: (standard?.kind ?? 'blackbody_source') as StandardKind,
    serialNumber: standard?.serialNumber ?? '',
    certificateNumber: standard?.certificateNumber ?? '',
    issuingLaboratory: standard?.issuingLaboratory ?? '',
    calibrationDate: standard?.calibrationDate ?? '',
    dueDate: standard?.dueDate ?? '',
    status: (standard?.status ?? 'in_service') as StandardStatus,
    notes: standard?.notes ?? '',
  });
  const [rows, setRows] = useState<Row[]>(
    standard?.values.map((v) => ({
      id: v.id,
      quantity: v.quantity,
      value: String(v.value),
      unit: v.unit,
      U: String(v.expandedUncertainty),
      k: String(v.coverageFactor),
      atValue: v.atValue === null ? '' : String(v.atValue),
      atUnit: v.atUnit ?? '',
    })) ?? [],
  );
  const [saved, setSaved] = useState(false);
  const issues: ApiIssue[] = save.error instanceof ApiError ? save.error.issues : [];
  const issue = (...path: Array<string | number>) => issues.find((i) => i.path.join('.') === ['body', ...path].join('.'))?.message;
  const set = (k: keyof typeof f) => (e: { target: { value: string } }) => setF((x) => ({ ...x, [k]: e.target.value }));
  const setRow = (i: number, k: keyof Row, v: string) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, [k]: v } : r)));

  async function submit(e: FormEvent) {
    e.preventDefault();
    setSaved(false);
    const input: StandardInput = {
      ...f,
      values: rows.map((r) => ({
        ...(r.id ? { id: r.id } : {}),
        quantity: r.quantity,
        value: num(r.value),
        unit: r.unit,
        expandedUncertainty: num(r.U),
        coverageFactor: num(r.k),
        atValue: r.atValue.trim() === '' ? null : num(r.atValue),
        atUnit: r.atValue.trim() === '' ? null : r.atUnit,
      })),
    };
    // NaN is not JSON: send it as a string so the server names the field.
    const body = JSON.parse(JSON.stringify(input, (_k, v) => (typeof v === 'number' && Number.isNaN(v) ? 'not a number' : v)));
    try {
      const s = await save.mutateAsync(body);
      setSaved(true);
      onSaved(s);
    } catch {
      /* shown below */
    }
  }

  return (
    <form onSubmit={submit} className="space-y-6" noValidate>
      <fieldset className="grid gap-4 rounded-card border border-line bg-surface p-4 md:grid-cols-2">
        <legend className="px-1 text-sm font-semibold text-ink">Identity and calibration</legend>
        <TextField label="Name" value={f.name} onChange={set('name')} error={issue('name')} required />
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink">
          Kind
          <select className="rounded-field border border-line-strong bg-surface px-3 py-2 text-base" value={f.kind} onChange={set('kind')}>
            {STANDARD_KINDS.map((k) => (
              <option key={k} value={k}>{STANDARD_KIND_LABELS[k]}</option>
            ))}
          </select>
        </label>
        <TextField label="Serial number" value={f.serialNumber} onChange={set('serialNumber')} error={issue('serialNumber')} />
        <TextField label="Certificate number" value={f.certificateNumber} onChange={set('certificateNumber')} error={issue('certificateNumber')} />
        <TextField label="Issuing laboratory" value={f.issuingLaboratory} onChange={set('issuingLaboratory')} error={issue('issuingLaboratory')} className="md:col-span-2" />
        <TextField label="Calibration date" type="date" value={f.calibrationDate} onChange={set('calibrationDate')} error={issue('calibrationDate')} />
        <TextField label="Due date" type="date" value={f.dueDate} onChange={set('dueDate')} error={issue('dueDate')} hint="Flagged “due soon” 30 days before, “overdue” the day after." />
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink">
          Status
          <select className="rounded-field border border-line-strong bg-surface px-3 py-2 text-base" value={f.status} onChange={set('status')}>
            {STANDARD_STATUSES.map((s) => (
              <option key={s} value={s}>{STANDARD_STATUS_LABELS[s]}</option>
            ))}
          </select>
        </label>
        <TextField label="Notes" value={f.notes} onChange={set('notes')} error={issue('notes')} />
      </fieldset>

      <fieldset className="rounded-card border border-line bg-surface p-4">
        <legend className="px-1 text-sm font-semibold text-ink">Certified values</legend>
        <p className="mb-3 text-sm text-ink-muted">
          As printed on the certificate: value, unit, expanded uncertainty <i>U</i> and coverage factor <i>k</i>; the standard uncertainty is <i>u</i> = <i>U</i>/<i>k</i>. Give a point when the value holds at a stated temperature or wavelength.
        </p>
        {rows.length > 0 && (
          <table className="w-full text-sm">
            <thead className="text-left text-xs text-ink-muted">
              <tr>
                <th scope="col" className="p-1">Quantity</th>
                <th scope="col" className="p-1 text-right">Value</th>
                <th scope="col" className="p-1">Unit</th>
                <th scope="col" className="p-1 text-right"><i>U</i></th>
                <th scope="col" className="p-1 text-right"><i>k</i></th>
                <th scope="col" className="p-1 text-right">At point</th>
                <th scope="col" className="p-1">Point unit</th>
                <th scope="col" className="p-1"><span className="sr-only">Remove</span></th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r, i) => {
                const rowIssues = issues.filter((x) => x.path[0] === 'body' && x.path[1] === 'values' && x.path[2] === i);
                return (
                  <tr key={r.id ?? `new-${i}`} className="align-top">
                    <td className="p-1"><input aria-label={`Quantity, row ${i + 1}`} className={cell} value={r.quantity} onChange={(e) => setRow(i, 'quantity', e.target.value)} /></td>
                    <td className="p-1"><input aria-label={`Value, row ${i + 1}`} inputMode="decimal" className={`${cell} text-right font-mono tabular-nums`} value={r.value} onChange={(e) => setRow(i, 'value', e.target.value)} /></td>
                    <td className="p-1"><input aria-label={`Unit, row ${i + 1}`} className={`${cell} w-20`} value={r.unit} onChange={(e) => setRow(i, 'unit', e.target.value)} /></td>
                    <td className="p-1"><input aria-label={`Expanded uncertainty U, row ${i + 1}`} inputMode="decimal" className={`${cell} text-right font-mono tabular-nums`} value={r.U} onChange={(e) => setRow(i, 'U', e.target.value)} /></td>
                    <td className="p-1"><input aria-label={`Coverage factor k, row ${i + 1}`} inputMode="decimal" className={`${cell} w-16 text-right font-mono tabular-nums`} value={r.k} onChange={(e) => setRow(i, 'k', e.target.value)} /></td>
                    <td className="p-1"><input aria-label={`Point, row ${i + 1}`} inputMode="decimal" className={`${cell} text-right font-mono tabular-nums`} value={r.atValue} onChange={(e) => setRow(i, 'atValue', e.target.value)} /></td>
                    <td className="p-1"><input aria-label={`Point unit, row ${i + 1}`} className={`${cell} w-20`} value={r.atUnit} onChange={(e) => setRow(i, 'atUnit', e.target.value)} /></td>
                    <td className="p-1">
                      <Button variant="quiet" className="px-2 py-1" onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))}>
                        Remove<span className="sr-only"> row {i + 1}</span>
                      </Button>
                      {rowIssues.map((x) => (
                        <p key={x.path.join('.')} className="text-xs font-medium text-danger">
                          <span aria-hidden="true">✕ </span>
                          {String(x.path[3])}: {x.message}
                        </p>
                      ))}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
        <Button variant="secondary" className="mt-3" onClick={() => setRows((rs) => [...rs, emptyRow()])}>
          Add a certified value
        </Button>
      </fieldset>

      {save.error && (
        <Notice tone="danger" label="Not saved" role="alert">
          {save.error.message}
          {issues.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {issues.map((i) => (
                <li key={i.path.join('.')}>{i.path.slice(1).join(' › ')}: {i.message}</li>
              ))}
            </ul>
          )}
        </Notice>
      )}
      {saved && !save.error && <Notice tone="ok" label="Saved" role="status">The standard and its certified values are saved; the change is in the audit log.</Notice>}
      <Button type="submit" disabled={save.isPending}>{save.isPending ? 'Saving…' : standard ? 'Save changes' : 'Add the standard'}</Button>
    </form>
  );
}
