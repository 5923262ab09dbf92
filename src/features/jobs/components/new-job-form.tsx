import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/text-field';
import { ApiError } from '../../../lib/api-client';
import { useCustomers } from '../../customers/api/customers';
import { useCreateJob, useJobOptions } from '../api/jobs';

const sel = 'rounded-field border border-line-strong bg-surface px-3 py-2 text-base';

/** New job: customer → item → released model version → dates, location, environment. */
export function NewJobForm() {
  const customers = useCustomers();
  const options = useJobOptions();
  const create = useCreateJob();
  const navigate = useNavigate();
  const [f, setF] = useState({ customerId: '', itemId: '', templateVersionId: '', receivedOn: '', calibratedOn: '', location: '', t: '', tu: '', h: '', hu: '' });
  const [error, setError] = useState<ApiError | null>(null);
  const items = options.data?.items.filter((i) => i.customerId === f.customerId) ?? [];
  const set = (k: keyof typeof f) => (e: { target: { value: string } }) => setF((x) => ({ ...x, [k]: e.target.value, ...(k === 'customerId' ? { itemId: '' } : {}) }));
  const num = (s: string) => (s.trim() === '' ? undefined : Number(s.replace(',', '.')));
  const issue = (field: string) => error?.issues.find((i) => i.path.includes(field))?.message;

  async function submit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    const environment: Record<string, { value: number; u?: number; unit: string }> = {};
    if (num(f.t) !== undefined) environment.temperature = { value: num(f.t)!, u: num(f.tu), unit: '°C' };
    if (num(f.h) !== undefined) environment.humidity = { value: num(f.h)!, u: num(f.hu), unit: '%' };
    try {
      const { job } = await create.mutateAsync({
        customerId: f.customerId,
        itemId: f.itemId,
        templateVersionId: f.templateVersionId,
        receivedOn: f.receivedOn || null,
        calibratedOn: f.calibratedOn || null,
        location: f.location,
        environment,
      });
      navigate(`/app/jobs/${job.id}`);
    } catch (err) {
      setError(err instanceof ApiError ? err : new ApiError(0, 'ERROR', String(err)));
    }
  }

  return (
    <form onSubmit={(e) => void submit(e)} className="grid max-w-3xl gap-4 md:grid-cols-2" noValidate>
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Customer
        <select className={sel} value={f.customerId} onChange={set('customerId')} required>
          <option value="">Choose…</option>
          {customers.data?.map((c) => <option key={c.id} value={c.id}>{c.organisation}</option>)}
        </select>
        {issue('customerId') && <span className="text-danger">✕ {issue('customerId')}</span>}
      </label>
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Item to calibrate
        <select className={sel} value={f.itemId} onChange={set('itemId')} disabled={!f.customerId} required>
          <option value="">{f.customerId ? (items.length ? 'Choose…' : 'This customer has no items yet') : 'Choose the customer first'}</option>
          {items.map((i) => <option key={i.id} value={i.id}>{[i.description, i.maker, i.model, i.serial ? `s/n ${i.serial}` : null].filter(Boolean).join(', ')}</option>)}
        </select>
        {issue('itemId') && <span className="text-danger">✕ {issue('itemId')}</span>}
      </label>
      <label className="flex flex-col gap-1 text-sm font-semibold md:col-span-2">
        Measurement model (released versions only)
        <select className={sel} value={f.templateVersionId} onChange={set('templateVersionId')} required>
          <option value="">Choose…</option>
          {options.data?.templateVersions.map((v) => <option key={v.id} value={v.id}>{v.name} — version {v.version}</option>)}
        </select>
        {issue('templateVersionId') && <span className="text-danger">✕ {issue('templateVersionId')}</span>}
      </label>
      <TextField label="Received on" type="date" value={f.receivedOn} onChange={set('receivedOn')} error={issue('receivedOn')} />
      <TextField label="Calibrated on" type="date" value={f.calibratedOn} onChange={set('calibratedOn')} error={issue('calibratedOn')} />
      <TextField className="md:col-span-2" label="Location" value={f.location} onChange={set('location')} hint="Where the calibration was made (room, or the customer’s site)." />
      <fieldset className="grid grid-cols-2 gap-3 md:col-span-2 md:grid-cols-4">
        <legend className="mb-1 text-sm font-semibold">Environmental conditions</legend>
        <TextField label="Temperature / °C" inputMode="decimal" value={f.t} onChange={set('t')} />
        <TextField label="u(temperature) / °C" inputMode="decimal" value={f.tu} onChange={set('tu')} />
        <TextField label="Relative humidity / %" inputMode="decimal" value={f.h} onChange={set('h')} />
        <TextField label="u(humidity) / %" inputMode="decimal" value={f.hu} onChange={set('hu')} />
      </fieldset>
      {error && !error.issues.length && <Notice tone="danger" label="Not saved" className="md:col-span-2">{error.message}</Notice>}
      <div className="md:col-span-2">
        <Button type="submit" disabled={create.isPending}>Open the job</Button>
      </div>
    </form>
  );
}
