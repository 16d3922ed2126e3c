'use client';
import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { ParentSize } from '@visx/responsive';
import { scaleLinear, scaleLog } from '@visx/scale';
import { LinePath } from '@visx/shape';
import type { SpreadCurvePoint } from '@/lib/psychometrics/report-types';
import { COLORS, formatNumber, spacedLogTicks } from './chart-theme';

// How shoppers differ at one base price (the mixed model): the typical shopper's notice curve
// (teal, solid) next to the population curve, the share of all shoppers who notice each
// discount (ink, dashed; flatter, because shoppers' own thresholds spread). Each line is named
// at its end, so colour is never the only cue. Same axes and layout rules as the curve cards.

const M = { top: 14, right: 14, bottom: 44, left: 58 };
const FONT = 'var(--font-mono), monospace';

export function SpreadCurves({ curve, domain, width, height = 240, title }: { curve: SpreadCurvePoint[]; domain: [number, number]; width?: number; height?: number; title: string }) {
  return (
    <figure aria-label={title} data-testid="spread-figure">
      {width ? <SpreadSvg curve={curve} domain={domain} width={width} height={height} /> : (
        <div style={{ height }}>
          <ParentSize debounceTime={50}>{({ width: w }) => (w > 0 ? <SpreadSvg curve={curve} domain={domain} width={w} height={height} /> : null)}</ParentSize>
        </div>
      )}
      <figcaption className="hint">Solid teal: the typical shopper&apos;s notice rate. Dashed: the share of all shoppers who notice each discount.</figcaption>
    </figure>
  );
}

function SpreadSvg({ curve, domain, width, height }: { curve: SpreadCurvePoint[]; domain: [number, number]; width: number; height: number }) {
  const [lo, hi] = domain;
  const innerW = Math.max(60, width - M.left - M.right), innerH = height - M.top - M.bottom;
  const xs = scaleLog({ domain, range: [0, innerW] });
  const ys = scaleLinear({ domain: [0, 1], range: [innerH, 0] });
  // Rounded so the server render and the browser's hydration agree to the last digit.
  const x = (v: number) => Math.round(Number(xs(v)) * 100) / 100;
  const y = (v: number) => Math.round(Number(ys(v)) * 100) / 100;
  const pts = curve.map((p) => ({ ...p, x: p.discount * 100 })).filter((p) => p.x >= lo && p.x <= hi).sort((a, b) => a.x - b.x);
  const ticks = spacedLogTicks(lo, hi, (v) => Number(x(v)), formatNumber, 10);
  const last = pts[pts.length - 1];
  const mid = pts[Math.floor(pts.length / 2)];
  return (
    <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} style={{ maxWidth: "100%", height: "auto" }} role="img" aria-label="Typical shopper's notice curve and the share of all shoppers who notice">
      <Group left={M.left} top={M.top}>
        {[0.2, 0.4, 0.6, 0.8, 1].map((v) => <line key={v} x1={0} x2={innerW} y1={y(v)} y2={y(v)} stroke={COLORS.rule} />)}
        <LinePath data={pts} x={(d) => Number(x(d.x))} y={(d) => y(d.typical)} stroke={COLORS.teal} strokeWidth={2} />
        <LinePath data={pts} x={(d) => Number(x(d.x))} y={(d) => y(d.population)} stroke={COLORS.ink} strokeWidth={1.6} strokeDasharray="6 4" />
        {mid ? <text x={Number(x(mid.x)) + 6} y={y(mid.typical) - 6} fontSize={11} fill={COLORS.teal}>typical shopper</text> : null}
        {last ? <text x={Number(x(last.x)) - 4} y={y(last.population) + 14} textAnchor="end" fontSize={11} fill={COLORS.ink}>all shoppers</text> : null}
        <AxisLeft scale={ys} tickValues={[0, 0.2, 0.4, 0.6, 0.8, 1]} tickFormat={(v) => `${Math.round(Number(v) * 100)} %`} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'end', dx: -2, dy: '0.33em' }} />
        <AxisBottom top={innerH} scale={xs} tickValues={ticks} tickFormat={(v) => formatNumber(Number(v))} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'middle' }} />
        <text x={innerW / 2} y={innerH + 38} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Discount (% of base price, log scale)</text>
      </Group>
      <text transform={`translate(12, ${M.top + innerH / 2}) rotate(-90)`} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Notice rate</text>
    </svg>
  );
}
