import { useState } from 'react';
import { Link } from 'react-router';
import { JOB_STATUSES, JOB_STATUS_LABELS } from '../../../../shared/schemas/jobs.schema';
import { buttonClasses } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { useCustomers } from '../../customers/api/customers';
import { useJobs } from '../api/jobs';
import { AmendmentMark } from './amendment';
import { JobStatusBadge } from './job-status';

/** Calibration jobs with filters (status, customer), text search (number, item, customer) and pages. */
export function JobList({ canCreate }: { canCreate: boolean }) {
  const [status, setStatus] = useState('');
  const [customerId, setCustomerId] = useState('');
  const [q, setQ] = useState('');
  const [page, setPage] = useState(1);
  const customers = useCustomers();
  const jobs = useJobs({ status, customerId, q, page });
  const pages = jobs.data ? Math.max(1, Math.ceil(jobs.data.total / jobs.data.pageSize)) : 1;
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Search
          <input type="search" className="w-64 rounded-field border border-line-strong bg-surface px-3 py-1.5 font-normal" placeholder="Job number, item or customer" value={q} onChange={(e) => { setQ(e.target.value); setPage(1); }} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Status
          <select className="rounded-field border border-line-strong bg-surface px-2 py-1.5 font-normal" value={status} onChange={(e) => { setStatus(e.target.value); setPage(1); }}>
            <option value="">Any</option>
            {JOB_STATUSES.map((s) => <option key={s} value={s}>{JOB_STATUS_LABELS[s]}</option>)}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Customer
          <select className="rounded-field border border-line-strong bg-surface px-2 py-1.5 font-normal" value={customerId} onChange={(e) => { setCustomerId(e.target.value); setPage(1); }}>
            <option value="">Any</option>
            {customers.data?.map((c) => <option key={c.id} value={c.id}>{c.organisation}</option>)}
          </select>
        </label>
        {canCreate && <Link to="/app/jobs/new" className={buttonClasses('primary', 'ml-auto')}>New job</Link>}
      </div>
      {jobs.error && <p className="text-danger">The jobs could not be loaded: {jobs.error.message}</p>}
      {jobs.data && jobs.data.jobs.length === 0 ? (
        q || status || customerId ? (
          <EmptyState title="No job matches these filters">
            <p>Clear the search, the status or the customer to see every job.</p>
          </EmptyState>
        ) : (
          <EmptyState title="No calibration jobs listed">
            <p>Each job lists its customer, item, model version, status and calibration points. Open one with “New job”: choose the customer, the item and a released measurement model.</p>
          </EmptyState>
        )
      ) : (
        <table aria-label="Calibration jobs" className="w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-line-strong text-left text-xs text-ink-muted">
              <th className="py-2 pr-3">Job</th><th className="py-2 pr-3">Customer</th><th className="py-2 pr-3">Item</th><th className="py-2 pr-3">Status</th><th className="py-2 pr-3 text-right">Points</th><th className="py-2 pr-3">Calibrated</th><th className="py-2">Analyst</th>
            </tr>
          </thead>
          <tbody>
            {jobs.data?.jobs.map((j) => (
              <tr key={j.id} className="border-b border-line hover:bg-sunken">
                <td className="whitespace-nowrap py-1.5 pr-3 font-mono">
                  <Link className="font-semibold text-ember-strong underline" to={`/app/jobs/${j.id}`}>{j.number}</Link>
                  <AmendmentMark amends={j.amends} amendedBy={j.amendedBy} />
                </td>
                <td className="py-1.5 pr-3">{j.customer}</td>
                <td className="py-1.5 pr-3">{j.itemLabel}</td>
                <td className="py-1.5 pr-3"><JobStatusBadge status={j.status} /></td>
                <td className="py-1.5 pr-3 text-right font-mono tabular-nums">{j.points}</td>
                <td className="whitespace-nowrap py-1.5 pr-3 font-mono">{j.calibratedOn ?? '—'}</td>
                <td className="py-1.5">{j.analyst}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {pages > 1 && (
        <nav className="flex items-center gap-3 text-sm" aria-label="Pages">
          <button type="button" className={buttonClasses('secondary')} disabled={page <= 1} onClick={() => setPage(page - 1)}>Previous</button>
          <span>Page {page} of {pages}</span>
          <button type="button" className={buttonClasses('secondary')} disabled={page >= pages} onClick={() => setPage(page + 1)}>Next</button>
        </nav>
      )}
    </div>
  );
}
