/**
 * The calibration certificate as a react-pdf document.
 *
 * Where each ISO/IEC 17025:2017 item is printed (../shared/reference/README.md §5):
 * 7.8.2.1 a) title — first page; b) lab name and address — page header and "Issued by";
 * c) location of the activity — "Calibration"; d) certificate number with "Page x of y" on every
 * page (fixed header) and "End of certificate" after the annex; e) customer; f) method;
 * g) item and condition on receipt; h)–j) dates; l) "results relate only…"; m) results with
 * units; n) deviations, additions, exclusions; o) signatory and function.
 * 7.8.4.1: U with k and p; environmental conditions; traceability; conformity (7.8.6) with the
 * decision rule when the customer asked for one. 7.8.8: the amendment notice.
 */
import type { ReactNode } from 'react';
import { Document, Page, StyleSheet, Text, View, type Styles } from '@react-pdf/renderer';
import type { CertificateAnnex, CertificateData, CertificateResultPoint, ConformityResult } from '../../shared/schemas/certificate.schema';
import { MONO, SANS } from './fonts';
import { coverageProbability, dateRange, dateTimeUtc, dof, fixed, longDate, NBSP, num, percent, plusMinus, printReported, withUnit } from './format';
import { formatCondition, formatUnit } from '../../shared/format';
import { symbolPiece } from './equation';
import { ModelEquations, SymbolRun } from './equation-text';
import { McmHistogram } from './histogram';
import { palette, size } from './theme';

const s = StyleSheet.create({
  page: { fontFamily: SANS, fontSize: size.body, color: palette.ink, paddingTop: 68, paddingBottom: 58, paddingHorizontal: 46, lineHeight: 1.35 },
  headerLeft: { position: 'absolute', top: 26, left: 46, width: 300 },
  headerRight: { position: 'absolute', top: 26, right: 46, width: 180, alignItems: 'flex-end' },
  headerRule: { position: 'absolute', top: 50, left: 46, right: 46, borderBottomWidth: 0.8, borderBottomColor: palette.accent },
  headerLab: { fontSize: 8.4, fontWeight: 700 },
  headerSub: { fontSize: size.small, color: palette.muted },
  headerNumber: { fontSize: 8.4, fontWeight: 700 },
  footer: { position: 'absolute', bottom: 24, left: 46, right: 46, borderTopWidth: 0.5, borderTopColor: palette.rule, paddingTop: 5, flexDirection: 'row', justifyContent: 'space-between', fontSize: size.tiny, color: palette.muted },
  title: { fontSize: size.title, fontWeight: 700, letterSpacing: 0.2, lineHeight: 1.2, marginBottom: 2 },
  titleRow: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-end', marginBottom: 12 },
  numberBox: { alignItems: 'flex-end' },
  numberLabel: { fontSize: size.small, color: palette.muted },
  numberValue: { fontSize: 12, fontWeight: 700, fontFamily: MONO },
  amend: { borderWidth: 0.8, borderColor: palette.accent, padding: 6, marginBottom: 10 },
  amendTitle: { fontWeight: 700, color: palette.accent },
  h2: { fontSize: size.h2, fontWeight: 700, color: palette.accent, marginTop: 10, marginBottom: 4, paddingBottom: 2, borderBottomWidth: 0.5, borderBottomColor: palette.rule },
  h3: { fontSize: 8.8, fontWeight: 700, marginTop: 2, marginBottom: 2 },
  twoCol: { flexDirection: 'row', gap: 18 },
  col: { flex: 1 },
  colLabel: { fontSize: size.small, color: palette.muted, textTransform: 'uppercase', letterSpacing: 0.6, marginBottom: 2 },
  strong: { fontWeight: 700 },
  kv: { flexDirection: 'row', paddingVertical: 1.6, borderBottomWidth: 0.3, borderBottomColor: palette.faint },
  kvKey: { width: 132, color: palette.muted },
  kvValue: { flex: 1 },
  para: { marginBottom: 4 },
  small: { fontSize: size.small, color: palette.muted },
  table: { borderTopWidth: 0.8, borderTopColor: palette.ink, borderBottomWidth: 0.8, borderBottomColor: palette.ink, marginTop: 2, marginBottom: 4 },
  tr: { flexDirection: 'row', borderBottomWidth: 0.3, borderBottomColor: palette.rule, paddingVertical: 1.8 },
  trLast: { flexDirection: 'row', paddingVertical: 1.8 },
  th: { flexDirection: 'row', borderBottomWidth: 0.6, borderBottomColor: palette.ink, paddingVertical: 2.4 },
  thText: { fontSize: size.small, fontWeight: 700 },
  td: { fontSize: size.table, paddingHorizontal: 3, lineHeight: 1.25 },
  tdNum: { fontSize: size.table, fontFamily: MONO, textAlign: 'right', paddingHorizontal: 3, lineHeight: 1.25 },
  note: { fontSize: size.small, marginTop: 2 },
  caution: { marginTop: 10, padding: 6, backgroundColor: palette.faint, fontSize: size.small },
  approval: { marginTop: 12, flexDirection: 'row', gap: 18, borderTopWidth: 0.8, borderTopColor: palette.ink, paddingTop: 6 },
  annexPoint: { marginBottom: 8, paddingBottom: 6, borderBottomWidth: 0.5, borderBottomColor: palette.rule },
  summaryGrid: { flexDirection: 'row', gap: 14, marginTop: 3, fontSize: size.small, lineHeight: 1.3 },
  summaryCol: { flex: 1 },
  end: { marginTop: 14, textAlign: 'center', fontWeight: 700, fontSize: 8.6, borderTopWidth: 0.5, borderTopColor: palette.rule, paddingTop: 5 },
});

const CONFORMITY_WORDS: Record<ConformityResult, string> = {
  pass: 'Conforms',
  'conditional-pass': 'Conforms (conditional)',
  'conditional-fail': 'Does not conform (conditional)',
  fail: 'Does not conform',
};

type Style = Styles[string];

/** A model symbol as the screens typeset it (shared/format/symbols.ts), as in the model lines (./equation-text.tsx). */
function Sym({ symbol, style }: { symbol: string; style?: Style }) {
  return <SymbolRun piece={symbolPiece(symbol)} style={style} />;
}

function KV({ k, children }: { k: string; children: ReactNode }) {
  return (
    <View style={s.kv} wrap={false}>
      <Text style={s.kvKey}>{k}</Text>
      <View style={s.kvValue}>{typeof children === 'string' ? <Text>{children}</Text> : children}</View>
    </View>
  );
}

function Lines({ text, style }: { text: string; style?: Style }) {
  return (
    <>
      {text.split(/\r?\n/).map((line, i) => (
        <Text key={i} style={style}>{line}</Text>
      ))}
    </>
  );
}

interface Column<T> { title: ReactNode; width: number | string; num?: boolean; cell: (row: T, i: number) => ReactNode }

function Table<T>({ columns, rows }: { columns: Column<T>[]; rows: T[] }) {
  const cellStyle = (c: Column<T>) => [c.num ? s.tdNum : s.td, typeof c.width === 'number' ? { width: c.width } : { flex: 1 }];
  return (
    <View style={s.table}>
      <View style={s.th} fixed={false}>
        {columns.map((c, i) => (
          <View key={i} style={[{ paddingHorizontal: 3 }, typeof c.width === 'number' ? { width: c.width } : { flex: 1 }]}>
            <Text style={[s.thText, c.num ? { textAlign: 'right' } : {}]}>{c.title}</Text>
          </View>
        ))}
      </View>
      {rows.map((r, ri) => (
        <View key={ri} style={ri === rows.length - 1 ? s.trLast : s.tr} wrap={false}>
          {columns.map((c, ci) => {
            const content = c.cell(r, ri);
            return (
              <View key={ci} style={cellStyle(c)}>
                {typeof content === 'string' ? <Text style={c.num ? { textAlign: 'right' } : {}}>{content}</Text> : content}
              </View>
            );
          })}
        </View>
      ))}
    </View>
  );
}

function Header({ data }: { data: CertificateData }) {
  return (
    <>
      <View style={s.headerLeft} fixed>
        <Text style={s.headerLab}>{data.lab.name}</Text>
        <Text style={s.headerSub}>{`Calibration certificate · Accreditation ${data.lab.accreditationNumber}`}</Text>
      </View>
      <View style={s.headerRight} fixed>
        <Text style={s.headerNumber}>{`Certificate ${data.certificateNumber}`}</Text>
        <Text style={s.headerSub} render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`} />
      </View>
      <View style={s.headerRule} fixed />
    </>
  );
}

function Footer({ data }: { data: CertificateData }) {
  return (
    <View style={s.footer} fixed>
      <Text>{`${data.lab.name} · ${data.lab.address.split(/\r?\n/).join(', ')}`}</Text>
      <Text>Reproduce only in full.</Text>
    </View>
  );
}

/**
 * The reported result as UI-NOTES prescribes, "y ± U unit (k = 2.01, p ≈ 95 %)", with k and p in
 * italics (ISO 80000-1 §7.1). A Monte Carlo result has no coverage factor: its interval is stated.
 */
function Result({ point: p }: { point: CertificateResultPoint }) {
  const pm = plusMinus(p.reported.value, p.reported.U, p.reported.unit || p.unit);
  const prob = coverageProbability(p.coverageProbability).replace(/^p /, ' ');
  return (
    <Text>
      {`${pm} (`}
      {p.reportedFrom === 'mcm' ? null : (
        <>
          <Italic>k</Italic>
          {` = ${p.reported.k}, `}
        </>
      )}
      <Italic>p</Italic>
      {prob}
      {p.reportedFrom === 'mcm' ? ', Monte Carlo)' : ')'}
    </Text>
  );
}

function FirstPart({ data }: { data: CertificateData }) {
  const { lab, customer, item, dates, method, environment: env } = data;
  const anyOutside = data.results.some((r) => r.outsideAccreditation);
  // Points sharing one note get one footnote ("‡ Points 3, 6: …").
  const mcmNotes: Array<{ note: string; points: number[] }> = [];
  data.results.forEach((r, i) => {
    if (r.reportedFrom !== 'mcm' && !r.monteCarloNote) return;
    const note = r.monteCarloNote ?? 'the Monte Carlo result (JCGM 101:2008) is reported.';
    const entry = mcmNotes.find((n) => n.note === note);
    if (entry) entry.points.push(i + 1);
    else mcmNotes.push({ note, points: [i + 1] });
  });
  const conformityAsked = Boolean(data.conformity);

  return (
    <>
      <View style={s.titleRow}>
        <View>
          <Text style={s.title}>Calibration certificate</Text>
          <Text style={s.small}>Issued under ISO/IEC 17025:2017 accreditation {lab.accreditationNumber}{lab.accreditationBody ? `, ${lab.accreditationBody}` : ''}</Text>
        </View>
        <View style={s.numberBox}>
          <Text style={s.numberLabel}>Certificate number</Text>
          <Text style={s.numberValue}>{data.certificateNumber}</Text>
        </View>
      </View>

      {data.amends ? (
        <View style={s.amend} wrap={false}>
          <Text style={s.amendTitle}>Amendment: this certificate replaces certificate {data.amends.certificateNumber}.</Text>
          <Text>Reason: {data.amends.reason}</Text>
          <Text style={s.small}>Certificate {data.amends.certificateNumber} is superseded and should no longer be used.</Text>
        </View>
      ) : null}

      <View style={s.twoCol}>
        <View style={s.col}>
          <Text style={s.colLabel}>Issued by</Text>
          <Text style={s.strong}>{lab.name}</Text>
          <Lines text={lab.address} />
          {lab.contactEmail || lab.contactPhone ? <Text style={s.small}>{[lab.contactPhone, lab.contactEmail].filter(Boolean).join(' · ')}</Text> : null}
        </View>
        <View style={s.col}>
          <Text style={s.colLabel}>Customer</Text>
          <Text style={s.strong}>{customer.organisation}</Text>
          <Lines text={customer.address} />
          <Text style={s.small}>Contact: {customer.contact.name}{customer.contact.email ? ` · ${customer.contact.email}` : ''}</Text>
        </View>
      </View>

      <Text style={s.h2}>Item calibrated</Text>
      <KV k="Description">{item.description}</KV>
      <KV k="Maker / model">{`${item.maker} / ${item.model}`}</KV>
      <KV k="Serial number">{item.serialNumber}</KV>
      {item.customerId ? <KV k="Customer identification">{item.customerId}</KV> : null}
      <KV k="Condition on receipt">{item.conditionOnReceipt}</KV>

      <Text style={s.h2}>Calibration</Text>
      <KV k="Date of receipt">{longDate(dates.receipt)}</KV>
      <KV k="Date(s) of calibration">{dateRange(dates.calibration.from, dates.calibration.to)}</KV>
      <KV k="Date of issue">{longDate(dates.issue)}</KV>
      <KV k="Location">{lab.activityLocation}</KV>
      <KV k="Method">{`${method.templateName}, version ${method.templateVersion}`}</KV>
      <Text style={[s.para, { marginTop: 3 }]}>{method.description}</Text>
      <KV k="Environmental conditions">
        {`Ambient temperature ${formatCondition(env.temperature, NBSP)}; relative humidity ${formatCondition(env.humidity, NBSP)}${env.note ? `. ${env.note}` : ''}`}
      </KV>

      <Text style={s.h2} minPresenceAhead={60}>Results</Text>
      <Table
        columns={[
          { title: 'No.', width: 24, cell: (_r, i) => String(i + 1) },
          { title: 'Nominal', width: 62, cell: (r) => r.nominal.label },
          {
            title: data.resultLabel,
            width: '*',
            cell: (r) => (
              <Text>
                <Sym symbol={r.measurand.symbol} />
                <Text> = </Text>
                <Result point={r} />
                {r.outsideAccreditation ? <Text style={{ color: palette.accent }}> †</Text> : null}
                {r.reportedFrom === 'mcm' || r.monteCarloNote ? <Text style={{ color: palette.accent }}> ‡</Text> : null}
              </Text>
            ),
          },
          ...(conformityAsked ? [{ title: 'Conformity', width: 104, cell: (r: CertificateResultPoint) => (r.conformity ? CONFORMITY_WORDS[r.conformity] : 'not assessed') }] : []),
        ]}
        rows={data.results}
      />
      <Text style={s.note}>
        The expanded uncertainty <Italic>U</Italic> is the combined standard uncertainty multiplied by the coverage factor{' '}
        <Italic>k</Italic>, evaluated according to JCGM 100:2008 (GUM); the interval <Italic>y</Italic> ± <Italic>U</Italic> contains
        the value of the measurand with a coverage probability <Italic>p</Italic> of approximately 95 %. Each GUM result was checked
        against the Monte Carlo method of JCGM 101:2008; budgets, distributions and the checks are given in Annex A.
      </Text>
      {anyOutside ? <Text style={s.note}>† Outside the laboratory's scope of accreditation.</Text> : null}
      {mcmNotes.map(({ note, points }) => (
        <Text key={note} style={s.note}>{`‡ ${points.length > 1 ? 'Points' : 'Point'} ${points.join(', ')}: ${note}`}</Text>
      ))}

      {data.conformity ? (
        <View wrap={false}>
          <Text style={s.h2}>Statement of conformity</Text>
          <Text style={[s.para, s.strong]}>{data.conformity.statement}</Text>
          <KV k="Specification">{data.conformity.specification}</KV>
          <KV k="Decision rule">{data.conformity.decisionRule}</KV>
        </View>
      ) : null}

      <View wrap={false}>
        <Text style={s.h2}>Metrological traceability</Text>
        <Text style={s.para}>{data.traceability.statement}</Text>
        <Table
          columns={[
            { title: 'Reference standard', width: '*', cell: (r) => r.name },
            { title: 'Serial number', width: 70, cell: (r) => r.serialNumber },
            { title: 'Certificate', width: 72, cell: (r) => r.certificateNumber },
            { title: 'Issued by', width: 130, cell: (r) => r.issuingLaboratory },
            { title: 'Due', width: 60, cell: (r) => r.dueDate },
          ]}
          rows={data.traceability.standards}
        />
      </View>

      <View wrap={false}>
        <Text style={s.h2}>Statements</Text>
        <Text style={s.para}>{data.statements.relatesOnlyToItem}</Text>
        <Text style={s.para}>{data.statements.reproduceInFull}</Text>
        <Text style={s.para}>
          Deviations from, additions to or exclusions from the method: {data.statements.deviations.length ? data.statements.deviations.join(' ') : 'none.'}
        </Text>
        {data.statements.remarks.map((r, i) => (
          <Text key={i} style={s.para}>{r}</Text>
        ))}
        <View style={s.caution}>
          <Text>
            This certificate is valid only after review and approval by an authorised signatory of the laboratory. The rules of the
            accreditation body and local regulations take precedence over anything stated here. No assessment of optical-radiation
            or thermal safety of the item has been made.
          </Text>
        </View>
      </View>

      <View style={s.approval} wrap={false}>
        <View style={s.col}>
          <Text style={s.colLabel}>Approved by</Text>
          <Text style={s.strong}>{data.signatory.name}</Text>
          <Text>{data.signatory.function}</Text>
        </View>
        <View style={s.col}>
          <Text style={s.colLabel}>Approved on</Text>
          <Text>{dateTimeUtc(data.approvedAt)}</Text>
          <Text style={s.small}>Signed electronically; the digital signature is embedded in this PDF file.</Text>
        </View>
      </View>
    </>
  );
}

function BudgetTable({ annex, unit }: { annex: CertificateAnnex; unit: string }) {
  return (
    <Table
      columns={[
        { title: <Text><Text style={{ fontStyle: 'italic' }}>X</Text><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>i</Text></Text>, width: 34, cell: (r) => <Sym symbol={r.symbol} style={{ fontSize: size.table }} /> },
        { title: 'Quantity', width: '*', cell: (r) => r.meaning },
        { title: <Text>Estimate <Text style={{ fontStyle: 'italic' }}>x</Text><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>i</Text></Text>, width: 62, num: true, cell: (r) => withUnit(num(r.estimate), r.unit) },
        { title: <Text><Text style={{ fontStyle: 'italic' }}>u</Text>(<Text style={{ fontStyle: 'italic' }}>x</Text><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>i</Text>)</Text>, width: 58, num: true, cell: (r) => withUnit(num(r.u, 2), r.unit) },
        { title: 'Distribution', width: 52, cell: (r) => r.distribution },
        { title: <Text><Text style={{ fontStyle: 'italic' }}>c</Text><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>i</Text></Text>, width: 72, num: true, cell: (r) => (r.cUnit ? `${num(r.c, 3)} ${formatUnit(r.cUnit)}` : num(r.c, 3)) }, // "0.00216 K/µm" fits; a longer one breaks at the plain space before its unit, never inside the number
        { title: <Text>|<Text style={{ fontStyle: 'italic' }}>c</Text><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>i</Text>|<Text style={{ fontStyle: 'italic' }}>u</Text>(<Text style={{ fontStyle: 'italic' }}>x</Text><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>i</Text>)</Text>, width: 60, num: true, cell: (r) => withUnit(num(r.contribution, 2), unit) },
        { title: <Text><Text style={{ fontStyle: 'italic' }}>ν</Text><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>i</Text></Text>, width: 24, num: true, cell: (r) => dof(r.dof) },
        { title: 'Share', width: 36, num: true, cell: (r) => percent(r.share) },
      ]}
      rows={annex.gum.budget}
    />
  );
}

function Italic({ children }: { children: ReactNode }) {
  return <Text style={{ fontStyle: 'italic' }}>{children}</Text>;
}

function AnnexPoint({ point, index }: { point: CertificateResultPoint; index: number }) {
  const annex = point.annex;
  if (!annex) return null;
  const unit = point.unit;
  const { gum, mcm, validation } = annex;
  const interval = (iv: [number, number]) => `[${num(iv[0], 4)}, ${num(iv[1], 4)}] ${unit}`;
  return (
    <View style={s.annexPoint} wrap={false}>
      <View>
        <Text style={s.h3}>
          Point {index + 1} · nominal {point.nominal.label} · <Sym symbol={point.measurand.symbol} /> = <Result point={point} />
        </Text>
        {annex.equations.length ? <ModelEquations equations={annex.equations} inputs={annex.gum.budget.map((r) => r.symbol)} /> : null}
        <BudgetTable annex={annex} unit={unit} />
      </View>
      <View style={s.summaryGrid}>
        <View style={s.summaryCol}>
          <Text style={s.colLabel}>GUM (JCGM 100:2008)</Text>
          <Text><Italic>y</Italic> = {withUnit(num(gum.y, 4), unit)}; <Italic>u</Italic><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>c</Text>(<Italic>y</Italic>) = {withUnit(num(gum.u, 3), unit)}</Text>
          <Text><Italic>ν</Italic><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>eff</Text> = {gum.nuEff === null ? 'not applicable (correlated inputs)' : dof(gum.nuEff)}; <Italic>k</Italic> = {num(gum.k, 3)}; <Italic>U</Italic> = {withUnit(num(gum.U, 3), unit)}</Text>
          <Text>Interval <Italic>y</Italic> ± <Italic>U</Italic>: {interval(gum.interval)} (p = {printReported(String(gum.coverage * 100))} %)</Text>
          {mcm ? (
            <>
              <Text style={[s.colLabel, { marginTop: 5 }]}>Monte Carlo (JCGM 101:2008)</Text>
              <Text>{`${fixed(mcm.trials, 0)} trials, seed ${mcm.seed}`}</Text>
              <Text><Italic>y</Italic> = {withUnit(num(mcm.y, 4), unit)}; <Italic>u</Italic>(<Italic>y</Italic>) = {withUnit(num(mcm.u, 3), unit)}</Text>
              <Text>{mcm.intervalKind === 'shortest' ? 'Shortest' : 'Probabilistically symmetric'} coverage interval: {interval(mcm.interval)}</Text>
            </>
          ) : null}
          {validation ? (
            <>
              <Text style={[s.colLabel, { marginTop: 5 }]}>Validation (JCGM 101:2008 §8)</Text>
              <Text><Italic>δ</Italic> = {num(validation.delta, 2)}; <Italic>d</Italic><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>low</Text> = {num(validation.dLow, 2)}; <Italic>d</Italic><Text style={{ fontSize: 5.6, verticalAlign: 'sub' }}>high</Text> = {num(validation.dHigh, 2)} ({unit})</Text>
              <Text style={s.strong}>{validation.passed ? 'Passed: the GUM result is validated.' : 'Not passed: the Monte Carlo result is reported.'}</Text>
            </>
          ) : null}
        </View>
        {mcm ? (
          <View style={{ width: 240 }}>
            <McmHistogram annex={annex} symbol={point.measurand.symbol} unit={unit} width={240} height={118} />
            <Text style={[s.small, { fontSize: size.tiny }]}>
              Bars: Monte Carlo · curve: GUM normal · dashed: y ± U · solid: MC interval
            </Text>
          </View>
        ) : null}
      </View>
    </View>
  );
}

/**
 * The end of the certificate (7.8.2.1 d). Unbreakable: a one-line text split at the foot of a page
 * leaves an empty remainder there, which react-pdf sets on a blank page of its own.
 */
function EndMark({ data }: { data: CertificateData }) {
  return (
    <Text style={s.end} wrap={false}>
      End of certificate {data.certificateNumber}
    </Text>
  );
}

/** Annex A, closed by the end mark, which keeps to the last point's page; the end mark alone when no point has an annex. */
function Annex({ data }: { data: CertificateData }) {
  const withAnnex = data.results.map((point, index) => ({ point, index })).filter(({ point }) => point.annex);
  if (withAnnex.length === 0) return <EndMark data={data} />;
  const last = withAnnex.length - 1;
  return (
    // The annex starts on a page of its own: its heading was left alone at the foot of page 2.
    <View break>
      <Text style={[s.h2, { fontSize: 11 }]}>Annex A · Uncertainty budgets and Monte Carlo validation</Text>
      <Text style={[s.small, { marginBottom: 4 }]}>
        Part of certificate {data.certificateNumber}. Sensitivity coefficients are partial derivatives of the model at the estimates; the share is the part of the combined variance.
      </Text>
      {withAnnex.map(({ point, index }, i) =>
        i < last ? (
          <AnnexPoint key={index} point={point} index={index} />
        ) : (
          <View key={index} wrap={false}>
            <AnnexPoint point={point} index={index} />
            <EndMark data={data} />
          </View>
        ),
      )}
    </View>
  );
}

export function CertificateDocument({ data }: { data: CertificateData }) {
  return (
    <Document
      title={`Calibration certificate ${data.certificateNumber}`}
      author={data.lab.name}
      subject={`${data.item.description}, serial number ${data.item.serialNumber}`}
      creator="Emberline"
      producer="Emberline"
      language="en"
    >
      <Page size="A4" style={s.page}>
        <Header data={data} />
        <FirstPart data={data} />
        <Annex data={data} />
        <Footer data={data} />
      </Page>
    </Document>
  );
}
