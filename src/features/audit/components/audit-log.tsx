import { useState } from 'react';
import { AUDIT_ENTITY_LABELS, type AuditEntry } from '../../../../shared/schemas/audit.schema';
import { ROLE_LABELS, roleSchema } from '../../../../shared/schemas/roles';
import { Button, buttonClasses } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { auditCsvUrl, useAuditFacets, useAuditPage, useVerifyChain, type AuditFilters } from '../api/audit';
import { formatDateTimeUtc } from '../../../../shared/format/date';

const field = 'rounded-field border border-line-strong bg-surface px-3 py-2 text-sm';
const label = (entity: string) => AUDIT_ENTITY_LABELS[entity] ?? entity;

/** The audit trail: filters, pages of entries with before/after, CSV export and the chain check. */
export function AuditLog() {
  const [f, setF] = useState<AuditFilters>({ page: 1, pageSize: 25 });
  const q = useAuditPage(f);
  const facets = useAuditFacets();
  const verify = useVerifyChain();
  const set = (k: 'entity' | 'actorId' | 'from' | 'to') => (e: { target: { value: string } }) => setF((x) => ({ ...x, [k]: e.target.value || undefined, page: 1 }));
  const pages = q.data ? Math.max(1, Math.ceil(q.data.total / q.data.pageSize)) : 1;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold">Record kind
          <select className={field} value={f.entity ?? ''} onChange={set('entity')}>
            <option value="">All kinds</option>
            {facets.data?.entities.map((e) => <option key={e} value={e}>{label(e)}</option>)}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">User
          <select className={field} value={f.actorId ?? ''} onChange={set('actorId')}>
            <option value="">Everyone</option>
            {facets.data?.actors.map((a) => <option key={a.id} value={a.id}>{a.name ?? a.id}</option>)}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">From<input type="date" className={field} value={f.from ?? ''} onChange={set('from')} /></label>
        <label className="flex flex-col gap-1 text-sm font-semibold">To<input type="date" className={field} value={f.to ?? ''} onChange={set('to')} /></label>
        <a className={buttonClasses('secondary')} href={auditCsvUrl(f)} download>Export CSV</a>
        <Button variant="secondary" onClick={() => verify.mutate()} disabled={verify.isPending}>{verify.isPending ? 'Checking…' : 'Verify chain'}</Button>
      </div>
      {verify.data &&
        (verify.data.ok ? (
          <Notice tone="ok" label="✓ Chain intact" role="status">
            All {verify.data.checked} entries match their SHA-256 links (checked {formatDateTimeUtc(verify.data.verifiedAt, { seconds: true })}).
            {verify.data.lastHash && <span className="mt-1 block break-all font-mono text-xs">Last entry {verify.data.lastSeq}: {verify.data.lastHash}</span>}
          </Notice>
        ) : (
          <Notice tone="danger" label={`✕ Chain broken at entry ${verify.data.firstBrokenSeq}`} role="alert">
            {verify.data.reason} Entries before it ({verify.data.checked - 1}) are intact.
          </Notice>
        ))}
      {verify.error && <Notice tone="danger" label="The check could not run" role="alert">{verify.error.message}</Notice>}
      {q.error && <Notice tone="danger" label="The audit trail could not be loaded" role="alert">{q.error.message}</Notice>}
      {q.isPending && <p role="status" className="text-sm text-ink-muted">Loading…</p>}
      {q.data && (
        <>
          <p className="text-sm text-ink-muted">{q.data.total} {q.data.total === 1 ? 'entry' : 'entries'}, newest first.</p>
          <ol className="divide-y divide-line rounded-card border border-line bg-surface">
            {q.data.entries.map((e) => <Entry key={e.seq} e={e} />)}
          </ol>
          <nav aria-label="Pages" className="flex items-center gap-3 text-sm">
            <Button variant="secondary" disabled={f.page <= 1} onClick={() => setF((x) => ({ ...x, page: x.page - 1 }))}>Newer</Button>
            <span>Page {f.page} of {pages}</span>
            <Button variant="secondary" disabled={f.page >= pages} onClick={() => setF((x) => ({ ...x, page: x.page + 1 }))}>Older</Button>
          </nav>
        </>
      )}
    </div>
  );
}

function Entry({ e }: { e: AuditEntry }) {
  const role = roleSchema.safeParse(e.actorRole);
  return (
    <li className="px-4 py-3 text-sm">
      <div className="flex flex-wrap items-baseline gap-x-3">
        <span className="font-mono text-xs text-ink-muted">#{e.seq}</span>
        <time className="font-mono tabular-nums" dateTime={e.at}>{formatDateTimeUtc(e.at, { seconds: true })}</time>
        <span className="font-semibold">{e.action.replace(/_/g, ' ')}</span>
        <span>{label(e.entity)}</span>
        <span className="font-mono text-xs text-ink-muted">{e.entityId}</span>
        <span className="ml-auto">{e.actorName ?? 'System'}{role.success ? ` · ${ROLE_LABELS[role.data]}` : ''}</span>
      </div>
      {(e.before != null || e.after != null) && (
        <details className="mt-1">
          <summary className="cursor-pointer text-xs text-ember">Before and after</summary>
          <div className="mt-1 grid gap-2 md:grid-cols-2">
            <pre className="overflow-x-auto rounded-field bg-sunken p-2 text-xs">{e.before == null ? '—' : JSON.stringify(e.before, null, 2)}</pre>
            <pre className="overflow-x-auto rounded-field bg-sunken p-2 text-xs">{e.after == null ? '—' : JSON.stringify(e.after, null, 2)}</pre>
          </div>
        </details>
      )}
    </li>
  );
}
