/**
 * The Monte Carlo histogram of one calibration point drawn with react-pdf's SVG primitives:
 * bars as a probability density (JCGM 101:2008 §7.5, the discrete representation of the output
 * distribution), the GUM normal N(y, u²) overlaid, the GUM interval y ± U (dashed) and the
 * Monte Carlo coverage interval (solid) marked, axes labelled "quantity / unit" (ISO 80000-1 §6).
 */
import type { ComponentType, ReactNode } from 'react';
import { G, Line, Path, Rect, Svg, Text as SvgText, Tspan } from '@react-pdf/renderer';
import type { CertificateAnnex } from '../../shared/schemas/certificate.schema';
import { SANS } from './fonts';
import { subscriptUpright, symbolText } from '../../shared/format/symbols';
import { axisTicks } from '../../shared/format/ticks';
import { palette } from './theme';

export interface HistogramProps {
  annex: CertificateAnnex;
  /** Measurand (model identifier, typeset as on the screens) and unit for the axis label, "E / K". */
  symbol: string;
  unit: string;
  width?: number;
  height?: number;
}

export function McmHistogram({ annex, symbol, unit, width = 250, height = 150 }: HistogramProps) {
  const mcm = annex.mcm;
  if (!mcm) return null;
  const { edges, counts } = mcm.histogram;
  const { gum } = annex;
  const m = { left: 34, right: 8, top: 14, bottom: 30 };
  const pw = width - m.left - m.right;
  const ph = height - m.top - m.bottom;

  const total = counts.reduce((a, c) => a + c, 0) || 1;
  const density = counts.map((c, i) => c / (total * (edges[i + 1] - edges[i])));
  const xLo = Math.min(edges[0], gum.interval[0], mcm.interval[0]);
  const xHi = Math.max(edges[edges.length - 1], gum.interval[1], mcm.interval[1]);
  const pad = (xHi - xLo) * 0.03;
  const x0 = xLo - pad;
  const x1 = xHi + pad;
  const normalPeak = gum.u > 0 ? 1 / (gum.u * Math.sqrt(2 * Math.PI)) : 0;
  const yMax = Math.max(...density, normalPeak) * 1.08 || 1;
  const sx = (x: number) => m.left + ((x - x0) / (x1 - x0)) * pw;
  const sy = (d: number) => m.top + ph - (d / yMax) * ph;

  let curve = '';
  if (gum.u > 0) {
    const n = 120;
    for (let i = 0; i <= n; i += 1) {
      const x = x0 + ((x1 - x0) * i) / n;
      const z = (x - gum.y) / gum.u;
      const d = normalPeak * Math.exp(-0.5 * z * z);
      curve += `${i === 0 ? 'M' : 'L'}${sx(x).toFixed(2)},${sy(d).toFixed(2)} `;
    }
  }
  const xAxis = axisTicks(x0, x1, 5);
  const yAxis = axisTicks(0, yMax, 4);
  const xTicks = xAxis.values;
  const yTicks = yAxis.values;
  const font = { fontFamily: SANS, fontSize: 6.5 } as const;
  const marker = (x: number, dashed: boolean, color: string, key: string) => (
    <Line key={key} x1={sx(x)} x2={sx(x)} y1={m.top} y2={m.top + ph} stroke={color} strokeWidth={dashed ? 0.9 : 1.1} strokeDasharray={dashed ? '3 2' : undefined} />
  );

  return (
    <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`}>
      {counts.map((c, i) =>
        c > 0 ? (
          <Rect key={`b${i}`} x={sx(edges[i])} y={sy(density[i])} width={Math.max(0.2, sx(edges[i + 1]) - sx(edges[i]) - 0.3)} height={m.top + ph - sy(density[i])} fill={palette.bar} />
        ) : null,
      )}
      {curve ? <Path d={curve} stroke={palette.accent} strokeWidth={1} fill="none" /> : null}
      {/* Monte Carlo first, GUM dashed on top: where the two intervals agree both stay visible. */}
      {marker(mcm.interval[0], false, palette.ink, 'm0')}
      {marker(mcm.interval[1], false, palette.ink, 'm1')}
      {marker(gum.interval[0], true, palette.accent, 'g0')}
      {marker(gum.interval[1], true, palette.accent, 'g1')}
      <Line x1={m.left} x2={m.left + pw} y1={m.top + ph} y2={m.top + ph} stroke={palette.ink} strokeWidth={0.6} />
      <Line x1={m.left} x2={m.left} y1={m.top} y2={m.top + ph} stroke={palette.ink} strokeWidth={0.6} />
      {xTicks.map((t) => (
        <G key={`x${t}`}>
          <Line x1={sx(t)} x2={sx(t)} y1={m.top + ph} y2={m.top + ph + 2.5} stroke={palette.ink} strokeWidth={0.5} />
          <SvgText x={sx(t)} y={m.top + ph + 10} textAnchor="middle" style={font} fill={palette.ink}>{xAxis.label(t)}</SvgText>
        </G>
      ))}
      {yTicks.map((t) => (
        <G key={`y${t}`}>
          <Line x1={m.left - 2.5} x2={m.left} y1={sy(t)} y2={sy(t)} stroke={palette.ink} strokeWidth={0.5} />
          <SvgText x={m.left - 4} y={sy(t) + 2.2} textAnchor="end" style={font} fill={palette.ink}>{yAxis.label(t)}</SvgText>
        </G>
      ))}
      <AxisTitle symbol={symbol} unit={unit} centre={m.left + pw / 2} y={height - 4} />
      <SvgText x={m.left - 30} y={8} style={font} fill={palette.muted}>{`probability density / ${unit}⁻¹`}</SvgText>
    </Svg>
  );
}

/** react-pdf styles a span as it does its <Text> (style → props), though its types give only x and y. */
const Span = Tspan as unknown as ComponentType<{ x?: number; y?: number; style?: { fontSize?: number; fontStyle?: 'normal' | 'italic' }; children: ReactNode }>;

/**
 * "E / K" below the x axis, the symbol typeset as in the certificate's tables (italic base, lowered
 * subscript), as one run of spans so the gaps are the font's own. react-pdf anchors each span on
 * its own and measures nothing for us, so the run starts half an estimated width (0.55 em a
 * character) left of the centre. react-pdf ends a span that has no x of its own with a space (and
 * drops a leading one): the base takes an explicit x when a subscript follows it, so that only
 * the subscript's space separates the symbol from "/".
 */
function AxisTitle({ symbol, unit, centre, y }: { symbol: string; unit: string; centre: number; y: number }) {
  const { base, sub } = symbolText(symbol);
  const size = 7;
  const subSize = 5;
  const after = `/ ${unit}`;
  const width = 0.55 * (size * (base.length + 1 + after.length) + subSize * (sub?.length ?? 0));
  const x = centre - width / 2;
  return (
    <SvgText x={x} y={y} style={{ fontFamily: SANS, fontSize: size }} fill={palette.ink}>
      <Span x={sub !== null ? x : undefined} style={{ fontStyle: 'italic' }}>{base}</Span>
      {sub !== null ? <Span y={y + 1.8} style={{ fontSize: subSize, fontStyle: subscriptUpright(sub) ? 'normal' : 'italic' }}>{sub}</Span> : null}
      <Span y={y} style={{ fontStyle: 'normal' }}>{after}</Span>
    </SvgText>
  );
}
