import { Link, useNavigate, useParams } from 'react-router';
import { STANDARD_KIND_LABELS, STANDARD_STATUS_LABELS } from '../../../shared/schemas/standards.schema';
import { Notice } from '../../components/ui/notice';
import { useMe } from '../../features/session/api/get-me';
import { useStandard } from '../../features/standards/api/get-standard';
import { CertificateUpload } from '../../features/standards/components/certificate-upload';
import { DueStateText } from '../../features/standards/components/due-state';
import { StandardForm } from '../../features/standards/components/standard-form';
import { StandardsList } from '../../features/standards/components/standards-list';
import { canOpen, SECTIONS } from '../navigation';
import { ForbiddenPage } from './forbidden';
import { PageHeader } from './page-header';

/** /app/standards: the reference-standard register (ISO/IEC 17025 §6.4, §6.5). */
export function StandardsPage() {
  const { user } = useMe();
  const section = SECTIONS.standards;
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  const canEdit = user.role === 'quality_manager';
  return (
    <>
      <title>{`${section.label} · Emberline`}</title>
      <PageHeader title={section.label} viewOnly={!canEdit}>
        The lab’s own standards, their calibration certificates and certified values. Budgets take values from here, and the due date is checked when a job is calculated.
      </PageHeader>
      <StandardsList canEdit={canEdit} />
    </>
  );
}

/** /app/standards/new and /app/standards/:id. */
export function StandardDetailPage() {
  const { user } = useMe();
  const { id = '' } = useParams();
  const isNew = id === 'new';
  const q = useStandard(isNew ? '' : id);
  const navigate = useNavigate();
  const section = SECTIONS.standards;
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  const canEdit = user.role === 'quality_manager';
  const back = (
    <Link to="/app/standards" className="text-sm font-semibold text-ember underline-offset-2 hover:underline">
      ← All reference standards
    </Link>
  );
  if (isNew) {
    if (!canEdit) return <ForbiddenPage what="Adding reference standards" />;
    return (
      <>
        <title>New reference standard · Emberline</title>
        {back}
        <PageHeader title="New reference standard">Fill in the certificate’s details; upload its PDF once the standard is saved.</PageHeader>
        <StandardForm onSaved={(s) => navigate(`/app/standards/${s.id}`, { replace: true })} />
      </>
    );
  }
  if (q.isPending) return <p role="status" className="text-sm text-ink-muted">Loading the standard…</p>;
  if (q.isError && q.data === undefined) return <Notice tone="danger" label="This standard could not be loaded" role="alert">{q.error.message}</Notice>;
  const s = q.data;
  return (
    <>
      <title>{`${s.name} · Emberline`}</title>
      {back}
      <PageHeader title={s.name} viewOnly={!canEdit} />
      <dl className="mb-6 grid gap-x-6 gap-y-2 rounded-card border border-line bg-surface p-4 text-sm sm:grid-cols-3">
        <div><dt className="text-ink-muted">Kind</dt><dd>{STANDARD_KIND_LABELS[s.kind]}</dd></div>
        <div><dt className="text-ink-muted">Status</dt><dd>{STANDARD_STATUS_LABELS[s.status]}</dd></div>
        <div><dt className="text-ink-muted">Calibration</dt><dd data-testid="due-state"><DueStateText due={s.due} daysToDue={s.daysToDue} /> <span className="text-ink-muted">(due {s.dueDate})</span></dd></div>
      </dl>
      <div className="grid gap-6 xl:grid-cols-[2fr_1fr]">
        {canEdit ? (
          <StandardForm key={s.updatedAt} standard={s} onSaved={() => undefined} />
        ) : (
          <ValuesTable standard={s} />
        )}
        <CertificateUpload standard={s} canEdit={canEdit} />
      </div>
    </>
  );
}

function ValuesTable({ standard }: { standard: NonNullable<ReturnType<typeof useStandard>['data']> }) {
  const fmt = (n: number) => String(n).replace('-', '−');
  return (
    <section className="rounded-card border border-line bg-surface p-4">
      <h2 className="mb-2 text-lg font-semibold text-ink">Certified values</h2>
      <p className="mb-2 text-sm text-ink-muted">{standard.certificateNumber}, {standard.issuingLaboratory}, calibrated {standard.calibrationDate}.</p>
      <table className="w-full text-sm">
        <thead className="text-left text-xs text-ink-muted">
          <tr><th className="p-1">Quantity</th><th className="p-1 text-right">Value</th><th className="p-1 text-right"><i>U</i> (<i>k</i>)</th><th className="p-1 text-right"><i>u</i></th><th className="p-1 text-right">At</th></tr>
        </thead>
        <tbody>
          {standard.values.map((v) => (
            <tr key={v.id} className="border-t border-line">
              <td className="p-1">{v.quantity}</td>
              <td className="p-1 text-right font-mono tabular-nums">{fmt(v.value)}{v.unit ? ` ${v.unit}` : ''}</td>
              <td className="p-1 text-right font-mono tabular-nums">{fmt(v.expandedUncertainty)}{v.unit ? ` ${v.unit}` : ''} ({fmt(v.coverageFactor)})</td>
              <td className="p-1 text-right font-mono tabular-nums">{fmt(Number(v.standardUncertainty.toPrecision(3)))}</td>
              <td className="p-1 text-right font-mono tabular-nums">{v.atValue === null ? '—' : `${fmt(v.atValue)} ${v.atUnit ?? ''}`}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
