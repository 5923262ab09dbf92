/**
 * Assembles a certificate's CertificateData from a job as the jobs module gives it for review
 * (getJobForReview), the lab's details, the customer's contact and the reference standards used.
 * The review page's preview and the issued PDF are built by this same function, so what the
 * signatory reads is what the certificate says.
 *
 * Content (ISO/IEC 17025:2017 §7.8.2.1, §7.8.4.1, §7.8.6, §7.8.8; ../shared/reference/README.md §5)
 * comes from the records; where a record lacks something the certificate must say, the item is
 * reported in `missing` and the certificate is not assembled.
 *
 * Units: the engine works in SI; numbers here are converted to the units people read
 * (°C for a temperature, nm⁻¹ for spectral quantities, the input's display unit in the annex).
 */
import { reportResult, type EvaluationResult } from '../../../shared/engine';
import { certificateSchema, type CertificateData, type CertificateInput } from '../../../shared/schemas/certificate.schema';
import { convert, convertInterval, formatQuantity, formatUnit, sensitivityUnit } from '../../../shared/format';
import type { PointInput } from '../../../shared/schemas/jobs.schema';
import type { TemplateDefinition } from '../../../shared/schemas/template.schema';
import { reportedResult } from '../jobs/checks';

export type ReviewPoint = {
  id: string;
  position: number;
  nominalValue: number;
  nominalUnit: string;
  inputs: PointInput[];
  result: EvaluationResult | null;
  outsideScope: boolean;
  outsideScopeReason: string | null;
};

export type CertificateSource = {
  number: string;
  job: {
    number: string;
    receivedOn: string | null;
    calibratedOn: string | null;
    location: string;
    environment: { temperature?: { value: number; u?: number; unit: string }; humidity?: { value: number; u?: number; unit: string } };
    itemLabel: string;
  };
  lab: { name: string; address: string; accreditationNumber: string; contactEmail: string; contactPhone: string };
  customer: { organisation: string; address: string; contact: { name: string; email?: string } | null };
  item: { description: string; maker: string | null; model: string | null; serial: string | null; notes?: string | null } | null;
  template: { name: string; version: number; definition: TemplateDefinition };
  points: ReviewPoint[];
  standards: Array<{ name: string; serialNumber: string; certificateNumber: string; issuingLaboratory: string; dueDate: string }>;
  signatory: { name: string; function: string };
  amends?: { certificateNumber: string; reason: string };
  now: Date;
};

export type AssembleResult = { data: CertificateData; missing: [] } | { data: null; missing: Array<{ code: string; message: string }> };

/** A unit people read and how to get there from the SI value. */
type Shown = { unit: string; value: (si: number) => number; interval: (si: number) => number };

const identity: Shown = { unit: '', value: (v) => v, interval: (v) => v };

/** 12 significant digits: hides binary noise of a conversion (353.51 K − 273.15 → 80.36 °C, not 80.3600000000001). */
const tidy = (x: number) => (Number.isFinite(x) && x !== 0 ? Number(x.toPrecision(12)) : x);

/** The unit a measurand is shown in: a temperature in °C, a spectral quantity per nanometre, otherwise its own unit. */
export function measurandDisplay(measurand: { unit?: string; description?: string }): Shown {
  const unit = formatUnit(measurand.unit ?? '');
  const description = measurand.description ?? '';
  if (unit === 'K' && /temperature/i.test(description) && !/error|difference|correction|deviation/i.test(description)) {
    return { unit: '°C', value: (v) => tidy(convert(v, 'K', '°C')), interval: (v) => v };
  }
  for (const [si, shown] of [
    ['W m⁻² sr⁻¹ m⁻¹', 'W m⁻² sr⁻¹ nm⁻¹'],
    ['W m⁻² m⁻¹', 'W m⁻² nm⁻¹'],
  ] as const) {
    if (unit === si) return { unit: shown, value: (v) => tidy(convertInterval(v, si, shown)), interval: (v) => tidy(convertInterval(v, si, shown)) };
  }
  return { ...identity, unit };
}

/** An input's display unit: its estimate and u converted, its sensitivity scaled the other way. */
function inputDisplay(input: PointInput | undefined): { unit: string; estimate: (v: number) => number; u: (v: number) => number; c: (v: number) => number } {
  const si = formatUnit(input?.unit ?? '');
  const shown = input?.displayUnit ? formatUnit(input.displayUnit) : si;
  if (shown && si && shown !== si) {
    try {
      const f = convertInterval(1, shown, si); // SI per shown unit, e.g. 1e-6 m per µm
      return { unit: shown, estimate: (v) => tidy(convert(v, si, shown)), u: (v) => tidy(v / f), c: (v) => tidy(v * f) };
    } catch {
      /* not convertible: keep SI */
    }
  }
  return { unit: si === '1' ? '' : si, estimate: (v) => v, u: (v) => v, c: (v) => v };
}

const isoDay = (d: Date) => d.toISOString().slice(0, 10);
const clip = (s: string, max: number) => (s.length <= max ? s : `${s.slice(0, max - 1)}…`);

function conformityOf(def: TemplateDefinition, value: number, U: number): 'pass' | 'fail' | undefined {
  const rule = def.decisionRule;
  if (!rule || rule.kind === 'none' || rule.tolerance === undefined) return undefined;
  // ILAC-G8:2019 §4.2.1 simple acceptance (w = 0); §4.2.2 guard band w = U (binary).
  const limit = rule.kind === 'guard-band' ? rule.tolerance - U : rule.tolerance;
  return Math.abs(value) <= limit ? 'pass' : 'fail';
}

export function assembleCertificate(src: CertificateSource): AssembleResult {
  const missing: Array<{ code: string; message: string }> = [];
  const def = src.template.definition;
  const shown = measurandDisplay(def.measurand);

  if (!src.item) missing.push({ code: 'ITEM_MISSING', message: 'The item of this job is not in the register.' });
  if (!src.customer.contact) missing.push({ code: 'NO_CONTACT', message: `${src.customer.organisation} has no contact: add one in the customer register.` });
  if (!src.lab.address.trim()) missing.push({ code: 'LAB_ADDRESS', message: 'The laboratory address is not set: an administrator enters it under Laboratory details.' });
  const env = src.job.environment;
  if (!env.temperature || !env.humidity) missing.push({ code: 'ENVIRONMENT_MISSING', message: 'The environmental conditions (ambient temperature and humidity) are not recorded on the job (ISO/IEC 17025:2017 §7.8.4.1 a).' });
  if (src.standards.length === 0) missing.push({ code: 'NO_STANDARDS', message: 'No reference standard is named in the budgets: the certificate needs its traceability (§7.8.4.1 c).' });
  if (src.points.length === 0) missing.push({ code: 'NO_POINTS', message: 'The job has no calibration points.' });
  for (const p of src.points) if (!p.result) missing.push({ code: 'NO_RESULT', message: `Point ${p.position} has no result.` });
  if (missing.length) return { data: null, missing };

  const results: CertificateInput['results'] = src.points.map((p) => {
    const r = p.result!;
    const rep = reportedResult(r);
    const value = shown.value(rep.y);
    const U = shown.interval(rep.U);
    const k = rep.k ?? r.gum.k;
    const strings = reportResult(value, U, k, shown.unit, def.reportDigits === 1 ? 1 : 2);
    const nominalUnit = formatUnit(p.nominalUnit);
    const conformity = conformityOf(def, rep.y, rep.U);
    const budget = r.gum.budget.map((b) => {
      const input = p.inputs.find((i) => i.symbol === b.symbol);
      const d = inputDisplay(input);
      return {
        symbol: b.symbol,
        meaning: clip(input?.description ?? b.symbol, 300),
        unit: d.unit,
        estimate: d.estimate(b.estimate),
        u: d.u(b.u),
        distribution: b.distribution,
        c: shown.interval(d.c(b.c)),
        // Printed beside c_i: y per x_i as shown (K/µm; nothing for K per °C; y's unit for a dimensionless input).
        cUnit: sensitivityUnit(shown.unit, d.unit),
        contribution: shown.interval(b.contribution),
        dof: b.dof,
        share: Math.min(1, Math.max(0, b.share)),
        cMethod: b.cMethod,
      };
    });
    const mcm = r.mcm
      ? {
          trials: r.mcm.trials,
          seed: r.mcm.seed,
          y: shown.value(r.mcm.y),
          u: shown.interval(r.mcm.u),
          interval: [shown.value(r.mcm.interval[0]), shown.value(r.mcm.interval[1])] as [number, number],
          intervalKind: r.mcm.intervalKind,
          histogram: { edges: r.mcm.histogram.edges.map(shown.value), counts: r.mcm.histogram.counts },
        }
      : null;
    return {
      nominal: { value: p.nominalValue, unit: nominalUnit, label: formatQuantity(p.nominalValue, nominalUnit) },
      measurand: { symbol: def.measurand.symbol, name: clip(def.measurand.description, 200) },
      value,
      U,
      k,
      coverageProbability: r.gum.coverage,
      unit: shown.unit,
      reported: strings,
      ...(conformity ? { conformity } : {}),
      outsideAccreditation: p.outsideScope,
      reportedFrom: rep.method === 'monte-carlo' ? ('mcm' as const) : ('gum' as const),
      ...(rep.note ? { monteCarloNote: rep.note } : {}),
      annex: {
        equations: def.equations.slice(0, 20).map((e) => clip(e, 500)),
        gum: {
          y: shown.value(r.gum.y),
          u: shown.interval(r.gum.u),
          nuEff: r.gum.nuEff,
          k: r.gum.k,
          U: shown.interval(r.gum.U),
          coverage: r.gum.coverage,
          interval: [shown.value(r.gum.interval[0]), shown.value(r.gum.interval[1])] as [number, number],
          budget,
        },
        mcm,
        validation: r.validation,
      },
    };
  });

  const conformities = results.map((r) => r.conformity);
  const rule = def.decisionRule;
  const conformity =
    rule && rule.kind !== 'none' && rule.tolerance !== undefined && conformities.every(Boolean)
      ? {
          specification: `${def.certificate.resultLabel} within ± ${formatQuantity(shown.interval(rule.tolerance), shown.unit)}`,
          decisionRule:
            rule.statement ??
            (rule.kind === 'guard-band'
              ? 'Guarded acceptance (ILAC-G8:2019 §4.2.2): a point conforms when the measured value lies within the tolerance reduced by the expanded uncertainty (guard band w = U).'
              : 'Simple acceptance (ILAC-G8:2019 §4.2.1): a point conforms when the measured value lies within the tolerance; the uncertainty is not subtracted (w = 0).'),
          statement: conformities.every((c) => c === 'pass')
            ? `The item conforms to the specification at ${results.length === 1 ? 'the calibration point' : `all ${results.length} calibration points`}.`
            : `The item does not conform to the specification at point${conformities.filter((c) => c === 'fail').length === 1 ? '' : 's'} ${conformities
                .map((c, i) => (c === 'fail' ? String(i + 1) : null))
                .filter(Boolean)
                .join(', ')}.`,
        }
      : undefined;

  const item = src.item!;
  const calibratedOn = src.job.calibratedOn ?? isoDay(src.now);
  const firstAddressLine = src.lab.address.split('\n')[0]?.trim() ?? '';
  const fmtEnv = (c: { value: number; u?: number; unit: string }) => ({ value: c.value, U: 2 * (c.u ?? 0), unit: formatUnit(c.unit) || c.unit });

  const input: CertificateInput = {
    certificateNumber: src.number,
    ...(src.amends ? { amends: src.amends } : {}),
    lab: {
      name: src.lab.name,
      address: src.lab.address,
      accreditationNumber: src.lab.accreditationNumber.trim() || 'not stated',
      activityLocation: src.job.location.trim() || `The laboratory's permanent premises${firstAddressLine ? `, ${firstAddressLine}` : ''}`,
      ...(src.lab.contactEmail ? { contactEmail: src.lab.contactEmail } : {}),
      ...(src.lab.contactPhone ? { contactPhone: src.lab.contactPhone } : {}),
    },
    customer: {
      organisation: src.customer.organisation,
      address: src.customer.address.trim() || src.customer.organisation,
      contact: src.customer.contact!,
    },
    item: {
      description: item.description,
      maker: item.maker || 'not stated',
      model: item.model || 'not stated',
      serialNumber: item.serial || 'not stated',
      conditionOnReceipt: 'No defects or remarks were recorded on receipt.',
    },
    dates: {
      receipt: src.job.receivedOn ?? calibratedOn,
      calibration: { from: calibratedOn },
      issue: isoDay(src.now),
    },
    method: {
      templateName: src.template.name,
      templateVersion: String(src.template.version),
      description: clip(def.certificate.methodStatement, 4000),
    },
    environment: {
      temperature: fmtEnv(env.temperature!),
      humidity: fmtEnv(env.humidity!),
      // No-break spaces keep "k = 2" on one line (it broke as "(k" / "= 2)" in the preview).
      note: 'Environmental conditions are stated with their expanded uncertainty (k\u00a0=\u00a02).',
    },
    resultLabel: def.certificate.resultLabel,
    results,
    ...(conformity ? { conformity } : {}),
    traceability: {
      statement:
        'The results are metrologically traceable to the International System of Units (SI) through the reference standards listed, each calibrated by the laboratory named with it (ISO/IEC 17025:2017 §6.5).',
      standards: src.standards,
    },
    statements: {
      deviations: [],
      remarks: (def.certificate.statements ?? []).filter((s) => s.trim()).slice(0, 20),
    },
    signatory: src.signatory,
    approvedAt: src.now.toISOString(),
  };
  const parsed = certificateSchema.safeParse(input);
  if (!parsed.success) {
    return { data: null, missing: parsed.error.issues.map((i) => ({ code: 'CERTIFICATE_CONTENT', message: `Certificate content ${i.path.join('.')}: ${i.message}` })) };
  }
  return { data: parsed.data, missing: [] };
}
