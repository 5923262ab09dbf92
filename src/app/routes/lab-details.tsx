import type { LabPublic } from '../../../shared/schemas/lab.schema';

export function LabDetails({ lab }: { lab: LabPublic }) {
  return (
    <section aria-labelledby="lab-on-record" className="mb-6 rounded-card border border-line bg-surface px-6 py-5 shadow-card">
      <h2 id="lab-on-record" className="text-lg font-semibold">As printed on certificates</h2>
      <dl className="mt-3 grid grid-cols-[max-content_1fr] gap-x-6 gap-y-2 text-sm">
        <dt className="font-semibold text-ink-muted">Name</dt>
        <dd>{lab.name}</dd>
        <dt className="font-semibold text-ink-muted">Address</dt>
        <dd className="whitespace-pre-line">{lab.address}</dd>
        <dt className="font-semibold text-ink-muted">Accreditation number</dt>
        <dd>{lab.accreditationNumber || 'Not recorded'}</dd>
      </dl>
    </section>
  );
}
