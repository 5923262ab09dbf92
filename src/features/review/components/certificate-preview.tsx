import type { CertificateData } from '../../../../shared/schemas/certificate.schema';
import { formatCondition, formatCoverageProbability } from '../../../../shared/format';

function Row({ k, children }: { k: string; children: React.ReactNode }) {
  return (
    <div className="grid grid-cols-[12rem_1fr] gap-3 py-1">
      <dt className="font-semibold text-ink-muted">{k}</dt>
      <dd className="whitespace-pre-line">{children}</dd>
    </div>
  );
}

/** What the certificate will say, from the same CertificateData the PDF is rendered from. */
export function CertificatePreview({ data }: { data: CertificateData }) {
  return (
    <article aria-label="Certificate preview" className="rounded-card border border-line-strong bg-surface p-5 text-sm">
      <h3 className="text-lg font-semibold">Calibration certificate {data.certificateNumber}</h3>
      {data.amends && (
        <p className="mt-2 font-semibold">
          Replaces certificate {data.amends.certificateNumber}. Reason: {data.amends.reason}
        </p>
      )}
      <dl className="mt-3">
        <Row k="Laboratory">{`${data.lab.name}\n${data.lab.address}\nAccreditation ${data.lab.accreditationNumber}`}</Row>
        <Row k="Place of calibration">{data.lab.activityLocation}</Row>
        <Row k="Customer">{`${data.customer.organisation}\n${data.customer.address}\nContact: ${data.customer.contact.name}`}</Row>
        <Row k="Item">{`${data.item.description}; ${data.item.maker} ${data.item.model}, serial number ${data.item.serialNumber}\nOn receipt: ${data.item.conditionOnReceipt}`}</Row>
        <Row k="Dates">{`Received ${data.dates.receipt}; calibrated ${data.dates.calibration.from}${data.dates.calibration.to ? ` to ${data.dates.calibration.to}` : ''}; issued ${data.dates.issue}`}</Row>
        <Row k="Method">{`${data.method.templateName}, version ${data.method.templateVersion}\n${data.method.description}`}</Row>
        <Row k="Environment">{`Ambient temperature ${formatCondition(data.environment.temperature)}; relative humidity ${formatCondition(data.environment.humidity)}${data.environment.note ? `. ${data.environment.note}` : ''}`}</Row>
      </dl>
      <table className="mt-4 w-full border-collapse">
        <caption className="mb-1 text-left font-semibold">Results: {data.resultLabel}</caption>
        <thead>
          <tr className="border-b border-line-strong text-left">
            <th className="py-1 pr-3">Nominal</th>
            <th className="py-1 pr-3 text-right">Value</th>
            <th className="py-1 pr-3 text-right">
              <i>U</i>
            </th>
            <th className="py-1 pr-3">Coverage</th>
            {data.conformity && <th className="py-1 pr-3">Conformity</th>}
          </tr>
        </thead>
        <tbody>
          {data.results.map((r, i) => (
            <tr key={i} className="border-b border-line">
              <td className="py-1 pr-3">{r.nominal.label}</td>
              <td className="py-1 pr-3 text-right font-mono tabular-nums">
                {r.reported.value} {r.reported.unit}
              </td>
              <td className="py-1 pr-3 text-right font-mono tabular-nums">
                {r.reported.U} {r.reported.unit}
              </td>
              <td className="py-1 pr-3">
                {r.reportedFrom === 'mcm' ? 'Monte Carlo interval' : <><i>k</i> = {r.reported.k}</>}, {formatCoverageProbability(r.coverageProbability)}
                {r.outsideAccreditation ? ' · outside the scope of accreditation' : ''}
              </td>
              {data.conformity && <td className="py-1 pr-3">{r.conformity ?? 'not assessed'}</td>}
            </tr>
          ))}
        </tbody>
      </table>
      {data.conformity && <p className="mt-3"><strong>Conformity:</strong> {data.conformity.statement} Decision rule: {data.conformity.decisionRule}</p>}
      <div className="mt-3">
        <p className="font-semibold">Traceability</p>
        <p>{data.traceability.statement}</p>
        <ul className="mt-1 list-disc pl-5">
          {data.traceability.standards.map((s) => (
            <li key={s.serialNumber + s.certificateNumber}>
              {s.name}, serial {s.serialNumber}: certificate {s.certificateNumber} by {s.issuingLaboratory}, due {s.dueDate}
            </li>
          ))}
        </ul>
      </div>
      <ul className="mt-3 list-disc pl-5 text-ink-muted">
        <li>{data.statements.relatesOnlyToItem}</li>
        <li>{data.statements.reproduceInFull}</li>
        {data.statements.remarks.map((r) => (
          <li key={r}>{r}</li>
        ))}
      </ul>
      <p className="mt-3">
        Authorised by <strong>{data.signatory.name}</strong>, {data.signatory.function}. The annex gives each point’s uncertainty budget and Monte Carlo histogram.
      </p>
    </article>
  );
}
