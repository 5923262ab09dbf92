import { useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router';
import { type TemplateSummary } from '../../../../shared/schemas/template.schema';
import { formatUnit } from '../../../../shared/format';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { Notice } from '../../../components/ui/notice';
import { useCreateTemplate } from '../api/create-template';
import { useTemplates } from '../api/get-templates';
import { Sym } from './math-tex';
import { StatusText } from './status-text';
import { formatDate } from '../../../../shared/format/date';

/** Every measurement model with its latest version, its state in words and its released version. */
export function TemplateList({ canEdit }: { canEdit: boolean }) {
  const { data, error, isPending } = useTemplates();
  if (isPending) return <p className="text-sm text-ink-muted" role="status">Loading the measurement models…</p>;
  if (error) return <Notice tone="danger" label="The list could not be loaded" role="alert">{error.message}</Notice>;
  return (
    <div className="space-y-5">
      {canEdit && <NewTemplateForm />}
      {data.length === 0 ? (
        <EmptyState title="No measurement models yet">
          <p>{canEdit ? 'Give a new model a name above; you can then write its equations and inputs, check it and release it.' : 'Nothing has been released yet. A quality manager releases models before jobs can use them.'}</p>
        </EmptyState>
      ) : (
        <table className="w-full border-collapse rounded-card bg-surface text-sm shadow-card">
          <caption className="sr-only">Measurement models</caption>
          <thead>
            <tr className="border-b border-line-strong text-left text-xs text-ink-muted">
              <th scope="col" className="px-4 py-2 font-semibold">Model</th>
              <th scope="col" className="px-3 py-2 font-semibold">Measurand</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Latest version</th>
              <th scope="col" className="px-3 py-2 font-semibold">Status</th>
              <th scope="col" className="px-3 py-2 font-semibold">In use for new jobs</th>
              <th scope="col" className="px-4 py-2 font-semibold">Last change</th>
            </tr>
          </thead>
          <tbody>
            {data.map((t) => <Row key={t.id} t={t} />)}
          </tbody>
        </table>
      )}
    </div>
  );
}

function Row({ t }: { t: TemplateSummary }) {
  const released = t.versions.find((v) => v.status === 'released');
  return (
    <tr className="border-b border-line align-top last:border-b-0">
      <td className="px-4 py-2.5">
        <Link to={`/app/templates/versions/${t.latest.id}`} className="font-semibold">{t.name}</Link>
        {t.summary && <p className="mt-0.5 max-w-xl text-xs text-ink-muted">{t.summary}</p>}
      </td>
      <td className="px-3 py-2.5 whitespace-nowrap">
        <Sym name={t.measurand.symbol} />
        {t.measurand.unit && t.measurand.unit !== '1' && <span className="text-ink-muted"> in {formatUnit(t.measurand.unit)}</span>}
      </td>
      <td className="numeric px-3 py-2.5">{t.latest.version}</td>
      <td className="px-3 py-2.5"><StatusText status={t.latest.status} /></td>
      <td className="px-3 py-2.5">
        {released ? (
          <Link to={`/app/templates/versions/${released.id}`}>Version {released.version}, released {formatDate(released.releasedAt)}</Link>
        ) : (
          <span className="text-ink-muted">None</span>
        )}
      </td>
      <td className="px-4 py-2.5 whitespace-nowrap text-ink-muted">{formatDate(t.latest.updatedAt)}</td>
    </tr>
  );
}

function NewTemplateForm() {
  const [name, setName] = useState('');
  const create = useCreateTemplate();
  const navigate = useNavigate();
  const tooShort = name.trim().length < 3;
  async function submit(e: FormEvent) {
    e.preventDefault();
    if (tooShort) return;
    const v = await create.mutateAsync(name.trim());
    navigate(`/app/templates/versions/${v.id}`);
  }
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-3 rounded-card border border-line bg-surface px-5 py-4 shadow-card" aria-label="New measurement model">
      <label className="flex min-w-72 flex-1 flex-col gap-1 text-sm">
        <span className="font-semibold">New model</span>
        <input value={name} onChange={(e) => setName(e.target.value)} placeholder="e.g. Thermal imager against a flat-plate source" className="rounded-field border border-line-strong bg-surface px-3 py-2" />
      </label>
      <Button type="submit" disabled={tooShort || create.isPending}>{create.isPending ? 'Creating…' : 'Create draft'}</Button>
      {create.error && <p className="w-full text-sm text-danger" role="alert">{create.error.message}</p>}
      <p className="w-full text-xs text-ink-muted">The draft starts with one equation and one input; replace them with the model.</p>
    </form>
  );
}
