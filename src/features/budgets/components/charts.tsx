/**
 * Charts of a point and a job (recharts). Each takes plain data so the same series can be drawn
 * as SVG on the certificate later (server/pdf). Axes carry quantity and unit.
 */
import { Bar, BarChart, CartesianGrid, ComposedChart, ErrorBar, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import type { EvaluationResult } from '../../../../shared/engine';
import { planck } from '../../../../shared/engine';
import { formatNumber } from '../../../../shared/format/number';
import { axisTicks } from '../../../../shared/format/ticks';
import { formatUnit } from '../../../../shared/format/units';
import { Sym } from '../../templates/components/math-tex';
import { subscriptUpright, symbolText } from '../../templates/components/symbol-tex';

/** Tooltip values: four significant digits. */
const tick = (v: number) => formatNumber(v, { digits: 4 });
/** An axis from lo to hi with round ticks, all labelled with the same decimals. */
function axis(lo: number, hi: number, count = 5) {
  const t = axisTicks(lo, hi, count);
  return { type: 'number' as const, domain: [lo, hi] as [number, number], ticks: t.values, tickFormatter: t.label, allowDataOverflow: true, interval: 0 as const };
}
const axisStyle = { fontSize: 11, fill: 'var(--color-ink-muted)' };

/**
 * A model symbol inside an SVG <text> (recharts draws axes as SVG, where HTML <sub> does not
 * render): the same typeset form as `Sym` (symbolText), the subscript lowered and smaller.
 * Text after it must rise again by `SUB_DY`.
 */
const SUB_DY = 3;
function SymbolTspans({ name }: { name: string }) {
  const { base, sub } = symbolText(name);
  return (
    <>
      <tspan fontStyle="italic">{base}</tspan>
      {sub !== null && <tspan dy={SUB_DY} fontSize={8} fontStyle={subscriptUpright(sub) ? 'normal' : 'italic'}>{sub}</tspan>}
    </>
  );
}

/** A category tick naming an input: typeset symbol, the model identifier as its SVG title (tooltip). */
export function SymbolTick(props: { x?: number | string; y?: number | string; payload?: { value?: unknown } }) {
  const name = String(props.payload?.value ?? '');
  return (
    <g>
      <title>{name}</title>
      <text x={Number(props.x)} y={Number(props.y)} dy={4} textAnchor="end" fontSize={axisStyle.fontSize} fill={axisStyle.fill}>
        <SymbolTspans name={name} />
      </text>
    </g>
  );
}

/** A horizontal axis title "symbol / unit" below the axis, the symbol typeset. */
function symbolAxisTitle(symbol: string, unit: string) {
  return function SymbolAxisTitle(props: { viewBox?: unknown }) {
    const box = props.viewBox as { x: number; y: number; width: number; height: number } | undefined;
    if (!box) return null;
    return (
      <text x={box.x + box.width / 2} y={box.y + box.height + 14} textAnchor="middle" fontSize={axisStyle.fontSize} fill={axisStyle.fill}>
        <SymbolTspans name={symbol} />
        <tspan dy={symbolText(symbol).sub !== null ? -SUB_DY : 0}> / {unit}</tspan>
      </text>
    );
  };
}

/** Histogram bars of the Monte Carlo values as densities, with the GUM normal N(y, u²) at the same points. */
export function histogramSeries(result: EvaluationResult, maxBins = 80) {
  const h = result.mcm!.histogram;
  const n = h.counts.length;
  const group = Math.max(1, Math.ceil(n / maxBins));
  const total = h.counts.reduce((a, b) => a + b, 0);
  const out: Array<{ x: number; density: number; gum: number }> = [];
  const { y, u } = result.gum;
  for (let i = 0; i < n; i += group) {
    const lo = h.edges[i];
    const hi = h.edges[Math.min(i + group, n)];
    let c = 0;
    for (let j = i; j < Math.min(i + group, n); j++) c += h.counts[j];
    const x = (lo + hi) / 2;
    out.push({ x, density: c / total / (hi - lo), gum: u > 0 ? Math.exp(-0.5 * ((x - y) / u) ** 2) / (u * Math.sqrt(2 * Math.PI)) : 0 });
  }
  return out;
}

/** A key entry's mark, drawn as the chart draws it. */
function Swatch({ kind }: { kind: 'bars' | 'solid' | 'curve' | 'dashed' }) {
  return (
    <svg width="22" height="10" aria-hidden="true">
      {kind === 'bars' && <rect x="6" y="1" width="8" height="9" fill="var(--color-ember)" fillOpacity={0.65} />}
      {kind === 'solid' && <line x1="11" y1="0" x2="11" y2="10" stroke="var(--color-ember-strong)" strokeWidth={1.5} />}
      {kind === 'curve' && <path d="M1 9 Q11 -3 21 9" fill="none" stroke="var(--color-ink)" strokeWidth={1.5} />}
      {kind === 'dashed' && <line x1="11" y1="0" x2="11" y2="10" stroke="var(--color-info)" strokeWidth={1.5} strokeDasharray="3 2" />}
    </svg>
  );
}

export function HistogramChart({ result }: { result: EvaluationResult }) {
  if (!result.mcm) return null;
  const data = histogramSeries(result);
  const unit = formatUnit(result.unit);
  const [gl, gh] = result.gum.interval;
  const [ml, mh] = result.mcm.interval;
  const xLo = Math.min(data[0]?.x ?? gl, gl, ml);
  const xHi = Math.max(data[data.length - 1]?.x ?? gh, gh, mh);
  const yHi = Math.max(...data.map((d) => Math.max(d.density, d.gum))) * 1.08 || 1;
  return (
    <figure aria-label="Monte Carlo histogram with the GUM normal distribution">
      {/* A key rather than labels on the lines: the two intervals often nearly coincide. */}
      <ul className="mb-1 mt-3 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-muted" aria-label="Key">
        <li className="flex items-center gap-1.5"><Swatch kind="bars" />Monte Carlo trials</li>
        <li className="flex items-center gap-1.5"><Swatch kind="solid" />Monte Carlo {result.mcm.intervalKind} coverage interval</li>
        <li className="flex items-center gap-1.5"><Swatch kind="curve" />GUM normal N(y, u²)</li>
        <li className="flex items-center gap-1.5"><Swatch kind="dashed" />GUM interval y ± U</li>
      </ul>
      <ResponsiveContainer width="100%" height={260}>
        <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 28, left: 16 }}>
          <CartesianGrid stroke="var(--color-line)" vertical={false} />
          <XAxis dataKey="x" {...axis(xLo, xHi, 6)} tick={axisStyle} label={{ content: symbolAxisTitle(result.measurand, unit) }} />
          <YAxis {...axis(0, yHi, 4)} tick={axisStyle} label={{ value: `probability density / ${unit}⁻¹`, angle: -90, position: 'insideLeft', offset: 0, style: { ...axisStyle, textAnchor: 'middle' } }} width={72} />
          <Tooltip formatter={(v) => tick(Number(v))} labelFormatter={(l) => `${tick(Number(l))} ${unit}`} />
          <ReferenceArea x1={ml} x2={mh} fill="var(--color-ember-soft)" fillOpacity={0.5} />
          <Bar dataKey="density" name="Monte Carlo" fill="var(--color-ember)" fillOpacity={0.65} isAnimationActive={false} barSize={6} />
          <Line dataKey="gum" name="GUM normal" stroke="var(--color-ink)" dot={false} strokeWidth={1.5} isAnimationActive={false} />
          <ReferenceLine x={gl} stroke="var(--color-info)" strokeDasharray="5 3" />
          <ReferenceLine x={gh} stroke="var(--color-info)" strokeDasharray="5 3" />
          <ReferenceLine x={ml} stroke="var(--color-ember-strong)" />
          <ReferenceLine x={mh} stroke="var(--color-ember-strong)" />
        </ComposedChart>
      </ResponsiveContainer>
      <figcaption className="text-xs text-ink-muted">
        Bars: {formatNumber(result.mcm.trials, { decimals: 0, notation: 'fixed' })} Monte Carlo trials (seed {result.mcm.seed}), shaded: their {result.mcm.intervalKind} coverage interval (solid lines). Curve: the GUM normal distribution N(y, u²), dashed lines its interval <span className="whitespace-nowrap">y ± U</span>.
      </figcaption>
    </figure>
  );
}

export function ContributionsChart({ result }: { result: EvaluationResult }) {
  const data = [...result.gum.budget].sort((a, b) => b.contribution - a.contribution).map((b) => ({ symbol: b.symbol, contribution: b.contribution }));
  const unit = formatUnit(result.unit);
  const cMax = Math.max(...data.map((d) => d.contribution)) * 1.05 || 1;
  return (
    <figure aria-label="Contributions to the standard uncertainty, largest first">
      <ResponsiveContainer width="100%" height={Math.max(120, data.length * 24 + 40)}>
        <BarChart data={data} layout="vertical" margin={{ top: 4, right: 16, bottom: 24, left: 8 }}>
          <CartesianGrid stroke="var(--color-line)" horizontal={false} />
          <XAxis {...axis(0, cMax, 4)} tick={axisStyle} label={{ value: `|cᵢ| u(xᵢ) / ${unit}`, position: 'insideBottom', offset: -14, ...axisStyle }} />
          {/* interval 0: every input is named, the largest bar first (recharts would otherwise skip labels). */}
          <YAxis type="category" dataKey="symbol" interval={0} tick={SymbolTick} width={80} />
          <Tooltip formatter={(v) => `${tick(Number(v))} ${unit}`} labelFormatter={(l) => <Sym name={String(l)} />} />
          <Bar dataKey="contribution" fill="var(--color-ember)" isAnimationActive={false} />
        </BarChart>
      </ResponsiveContainer>
    </figure>
  );
}

/**
 * The vertical axis title "L_λ / (W m⁻² sr⁻¹ µm⁻¹)" (ISO 80000-7: L_λ, spectral radiance) with a
 * real subscript, which a plain label string cannot carry.
 */
function spectralRadianceTitle(props: { viewBox?: unknown }) {
  const box = props.viewBox as { x: number; y: number; height: number } | undefined;
  if (!box) return null;
  const x = box.x + 10;
  const y = box.y + box.height / 2;
  return (
    <text x={x} y={y} transform={`rotate(-90, ${x}, ${y})`} textAnchor="middle" fontSize={axisStyle.fontSize} fill={axisStyle.fill}>
      <tspan fontStyle="italic">L</tspan>
      <tspan dy={3} fontSize={8}>λ</tspan>
      <tspan dy={-3}> / (W m⁻² sr⁻¹ µm⁻¹)</tspan>
    </text>
  );
}

/** Planck's law L_λ(λ, T) around the working wavelength, in W m⁻² sr⁻¹ µm⁻¹ against µm. */
export function planckSeries(T: number, lambda: number) {
  const peak = 2.897771955e-3 / T;
  const hi = Math.max(lambda * 2, peak * 4);
  const out: Array<{ um: number; L: number }> = [];
  for (let i = 1; i <= 120; i++) {
    const l = (hi * i) / 120;
    out.push({ um: l * 1e6, L: planck(l, T) * 1e-6 });
  }
  return out;
}

export function PlanckChart({ T, lambda }: { T: number; lambda: number }) {
  const data = planckSeries(T, lambda);
  const umHi = data[data.length - 1]!.um;
  const lHi = Math.max(...data.map((d) => d.L)) * 1.05;
  return (
    <figure aria-label="Planck curve at the point's temperature">
      <ResponsiveContainer width="100%" height={220}>
        <LineChart data={data} margin={{ top: 22, right: 16, bottom: 28, left: 16 }}>
          <CartesianGrid stroke="var(--color-line)" vertical={false} />
          <XAxis dataKey="um" {...axis(0, umHi, 6)} tick={axisStyle} label={{ value: 'wavelength λ / µm', position: 'insideBottom', offset: -16, ...axisStyle }} />
          <YAxis {...axis(0, lHi, 4)} tick={axisStyle} width={72} label={{ content: spectralRadianceTitle }} />
          <Tooltip formatter={(v) => tick(Number(v))} labelFormatter={(l) => `${formatNumber(Number(l), { digits: 3 })} µm`} />
          <Line dataKey="L" stroke="var(--color-ember-strong)" dot={false} isAnimationActive={false} />
          <ReferenceLine x={lambda * 1e6} stroke="var(--color-info)" strokeDasharray="5 3" label={{ value: `λ = ${formatNumber(lambda * 1e6, { digits: 3 })} µm`, position: 'top', ...axisStyle }} />
        </LineChart>
      </ResponsiveContainer>
      <figcaption className="text-xs text-ink-muted">Spectral radiance of a blackbody at T = {formatNumber(T, { digits: 6 })} K (Planck’s law, exact SI constants); dashed: the working wavelength.</figcaption>
    </figure>
  );
}

/** The measurand with its expanded uncertainty at each calibration point of the job. */
export function ErrorAcrossJobChart({ points, unit, nominalUnit, label }: { points: Array<{ nominal: number; y: number; U: number }>; unit: string; nominalUnit: string; label: string }) {
  const data = points.map((p) => ({ ...p, err: p.U }));
  const nLo = Math.min(...points.map((p) => p.nominal));
  const nHi = Math.max(...points.map((p) => p.nominal));
  const nPad = (nHi - nLo) * 0.08 || Math.abs(nLo) * 0.1 || 1;
  const yLo = Math.min(0, ...points.map((p) => p.y - p.U));
  const yHi = Math.max(0, ...points.map((p) => p.y + p.U));
  const yPad = (yHi - yLo) * 0.08 || 1;
  return (
    <figure aria-label={`${label} at each calibration point`}>
      <ResponsiveContainer width="100%" height={220}>
        <ScatterChart margin={{ top: 8, right: 16, bottom: 28, left: 16 }}>
          <CartesianGrid stroke="var(--color-line)" />
          <XAxis dataKey="nominal" {...axis(nLo - nPad, nHi + nPad, 5)} tick={axisStyle} label={{ value: `Nominal value / ${formatUnit(nominalUnit)}`, position: 'insideBottom', offset: -16, ...axisStyle }} />
          <YAxis dataKey="y" {...axis(yLo - yPad, yHi + yPad, 5)} tick={axisStyle} width={72} label={{ value: `${label} / ${formatUnit(unit)}`, angle: -90, position: 'insideLeft', style: { ...axisStyle, textAnchor: 'middle' } }} />
          <ReferenceLine y={0} stroke="var(--color-line-strong)" />
          <Scatter data={data} fill="var(--color-ember-strong)" isAnimationActive={false}>
            <ErrorBar dataKey="err" direction="y" width={6} stroke="var(--color-ink)" isAnimationActive={false} />
          </Scatter>
        </ScatterChart>
      </ResponsiveContainer>
      <figcaption className="text-xs text-ink-muted">Bars: ± U at each point.</figcaption>
    </figure>
  );
}
