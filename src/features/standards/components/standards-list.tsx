import { useState } from 'react';
import { Link } from 'react-router';
import { STANDARD_KIND_LABELS, STANDARD_KINDS, STANDARD_STATUS_LABELS, STANDARD_STATUSES } from '../../../../shared/schemas/standards.schema';
import { buttonClasses } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { Notice } from '../../../components/ui/notice';
import { useStandards, type StandardFilters } from '../api/get-standards';
import { DueStateText } from './due-state';

const selectClass = 'rounded-field border border-line-strong bg-surface px-3 py-2 text-sm text-ink';

/** The register: filters, and one row per standard with its due state in words. */
export function StandardsList({ canEdit }: { canEdit: boolean }) {
  const [filters, setFilters] = useState<StandardFilters>({});
  const q = useStandards(filters);
  const set = (k: keyof StandardFilters) => (e: { target: { value: string } }) => setFilters((f) => ({ ...f, [k]: e.target.value || undefined }));
  const attention = q.data?.standards.filter((s) => s.due !== 'ok' && s.status === 'in_service') ?? [];

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink">
          Search
          <input type="search" className={`${selectClass} w-64`} placeholder="Name, serial or certificate" value={filters.q ?? ''} onChange={set('q')} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink">
          Kind
          <select className={selectClass} value={filters.kind ?? ''} onChange={set('kind')}>
            <option value="">All kinds</option>
            {STANDARD_KINDS.map((k) => (
              <option key={k} value={k}>{STANDARD_KIND_LABELS[k]}</option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink">
          Status
          <select className={selectClass} value={filters.status ?? ''} onChange={set('status')}>
            <option value="">Any status</option>
            {STANDARD_STATUSES.map((s) => (
              <option key={s} value={s}>{STANDARD_STATUS_LABELS[s]}</option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink">
          Calibration
          <select className={selectClass} value={filters.due ?? ''} onChange={set('due')}>
            <option value="">Any</option>
            <option value="overdue">Overdue</option>
            <option value="due_soon">Due soon</option>
            <option value="ok">In date</option>
          </select>
        </label>
        {canEdit && (
          <Link to="/app/standards/new" className={buttonClasses('primary', 'ml-auto')}>
            Add a standard
          </Link>
        )}
      </div>

      {attention.length > 0 && (
        <Notice tone="warn" label={`${attention.length} in-service ${attention.length === 1 ? 'standard needs' : 'standards need'} recalibration soon or now`}>
          Budgets that use an overdue standard are flagged when the calculation is checked.
        </Notice>
      )}

      {q.isPending && <p role="status" className="text-sm text-ink-muted">Loading the register…</p>}
      {q.error && <Notice tone="danger" label="The register could not be loaded" role="alert">{q.error.message}</Notice>}
      {q.data && q.data.standards.length === 0 && (
        <EmptyState title="No reference standards here">
          <p>{Object.values(filters).some(Boolean) ? 'Nothing matches these filters: clear one to see more.' : 'Add the lab’s first reference standard with its calibration certificate.'}</p>
        </EmptyState>
      )}
      {q.data && q.data.standards.length > 0 && (
        <div className="overflow-x-auto rounded-card border border-line bg-surface">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Reference standards, checked against {q.data.today}</caption>
            <thead className="border-b border-line bg-sunken text-xs text-ink-muted">
              <tr>
                <th scope="col" className="px-3 py-2">Standard</th>
                <th scope="col" className="px-3 py-2">Kind</th>
                <th scope="col" className="px-3 py-2">Serial</th>
                <th scope="col" className="px-3 py-2">Certificate</th>
                <th scope="col" className="px-3 py-2 text-right">Due</th>
                <th scope="col" className="px-3 py-2">Calibration</th>
                <th scope="col" className="px-3 py-2">Status</th>
              </tr>
            </thead>
            <tbody>
              {q.data.standards.map((s) => (
                <tr key={s.id} className="border-b border-line last:border-0">
                  <td className="px-3 py-2">
                    <Link to={`/app/standards/${s.id}`} className="font-semibold text-ember underline-offset-2 hover:underline">
                      {s.name}
                    </Link>
                  </td>
                  <td className="px-3 py-2">{STANDARD_KIND_LABELS[s.kind]}</td>
                  <td className="px-3 py-2 whitespace-nowrap font-mono tabular-nums">{s.serialNumber}</td>
                  <td className="px-3 py-2 whitespace-nowrap">
                    {s.certificateNumber}
                    <span className="block text-xs text-ink-muted">{s.hasCertificateFile ? 'PDF on file' : 'No PDF yet'}</span>
                  </td>
                  <td className="px-3 py-2 whitespace-nowrap text-right font-mono tabular-nums">{s.dueDate}</td>
                  <td className="px-3 py-2 whitespace-nowrap"><DueStateText due={s.due} daysToDue={s.daysToDue} /></td>
                  <td className="px-3 py-2 whitespace-nowrap">{STANDARD_STATUS_LABELS[s.status]}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {q.data && <p className="text-xs text-ink-muted">Due states as of {q.data.today}; “due soon” means within 30 days.</p>}
    </div>
  );
}
