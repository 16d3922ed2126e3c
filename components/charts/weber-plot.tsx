'use client';
import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { ParentSize } from '@visx/responsive';
import { scaleLog } from '@visx/scale';
import { LinePath } from '@visx/shape';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import { geometricMean } from '@/lib/psychometrics/math';
import { thresholdOf } from '@/lib/results-text';
import { COLORS, formatNumber, labelWidth, logTicks } from './chart-theme';

// Notice threshold in money against base price, both on log axes: each base's threshold with
// its interval (amber squares), the fitted power line (teal, slope = Weber slope) and two
// reference lines through the middle of the data: slope 1 ("same percentage") and slope 0
// ("same amount"). A threshold the data only bound is a hollow triangle at the bound, pointing
// the way the truth lies. Axis titles sit outside the tick labels; ticks are thinned by width.

type Pt = { x: number; y: number };
const M = { top: 16, right: 16, bottom: 46, left: 66 };
const FONT = 'var(--font-mono), monospace';

export function WeberPlot({ report, currency, width, height = 340 }: { report: AnalysisReport; currency: string; width?: number; height?: number }) {
  return (
    <figure aria-label="Weber view" data-testid="weber-plot">
      {width ? <WeberSvg report={report} currency={currency} width={width} height={height} /> : (
        <div style={{ height }}>
          <ParentSize debounceTime={50}>{({ width: w }) => (w > 0 ? <WeberSvg report={report} currency={currency} width={Math.min(w, 640)} height={height} /> : null)}</ParentSize>
        </div>
      )}
      <figcaption className="hint">
        Amber squares: each base price&apos;s notice threshold with its 95 % interval (hollow triangles: only a bound is known). Teal line: fitted power model (slope = Weber slope). Dashed: the reference lines.
      </figcaption>
    </figure>
  );
}

/** Ticks 1-2-5 in the domain, thinned so vertical neighbours (left axis) or labels (bottom) do not touch. */
function thin(ticks: number[], px: (v: number) => number, size: (v: number) => number): number[] {
  const out: number[] = [];
  for (const v of ticks) if (!out.length || Math.abs(px(v) - px(out[out.length - 1])) >= (size(v) + size(out[out.length - 1])) / 2 + 8) out.push(v);
  return out;
}

function WeberSvg({ report, currency, width, height }: { report: AnalysisReport; currency: string; width: number; height: number }) {
  const shown = report.bases.map((b) => ({ b, t: thresholdOf(b) }));
  const pts = shown.filter((s) => s.t.amount !== null && s.t.amount > 0).map((s) => ({ x: s.b.basePrice, y: s.t.amount!, ci: s.t.amountCi }));
  const bounds = shown.filter((s) => s.t.bound).map((s) => ({ x: s.b.basePrice, y: s.t.bound!.fraction * s.b.basePrice, kind: s.t.bound!.kind }));
  const prices = report.bases.map((b) => b.basePrice);
  const amounts = [...pts.flatMap((p) => [p.y, ...(p.ci ?? [])]), ...bounds.map((b) => b.y)].filter((v) => v > 0);
  if (!amounts.length) return <p className="hint">No base price has a threshold to plot.</p>;
  const xLo = Math.min(...prices) / 1.6, xHi = Math.max(...prices) * 1.6;
  const yLo = Math.min(...amounts) / 2, yHi = Math.max(...amounts) * 2;
  const innerW = Math.max(80, width - M.left - M.right), innerH = height - M.top - M.bottom;
  const x = scaleLog({ domain: [xLo, xHi], range: [0, innerW] });
  const y = scaleLog({ domain: [yLo, yHi], range: [innerH, 0] });
  const clipY = (v: number) => Math.min(yHi, Math.max(yLo, v));
  const line = (s: number, through: Pt): Pt[] => [xLo, xHi].map((v) => ({ x: v, y: clipY(through.y * Math.pow(v / through.x, s)) }));
  const power = report.models.power;
  const mid = power.thresholds[Math.floor(power.thresholds.length / 2)];
  const gm = { x: geometricMean(pts.length ? pts.map((p) => p.x) : prices), y: geometricMean(pts.length ? pts.map((p) => p.y) : amounts) };
  const refs = [
    { label: 'same percentage (slope 1)', pts: line(1, gm) },
    { label: 'same amount (slope 0)', pts: line(0, gm) },
  ];
  const fmt = (v: number) => formatNumber(v);
  const xTicks = thin(logTicks(xLo, xHi, [1, 2, 5]), (v) => Number(x(v)), (v) => labelWidth(fmt(v)));
  const yTicks = thin(logTicks(yLo, yHi, [1, 2, 5]), (v) => Number(y(v)), () => 12);
  // Rounded so the server render and the browser's hydration agree to the last digit.
  const X = (v: number) => Math.round(Number(x(v)) * 100) / 100, Y = (v: number) => Math.round(Number(y(v)) * 100) / 100;
  return (
    <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} style={{ maxWidth: "100%", height: "auto" }} role="img" aria-label={`Notice threshold in ${currency} against base price, log scales`}>
      <Group left={M.left} top={M.top}>
        {refs.map((r) => (
          <g key={r.label}>
            <line x1={X(r.pts[0].x)} y1={Y(r.pts[0].y)} x2={X(r.pts[1].x)} y2={Y(r.pts[1].y)} stroke={COLORS.muted} strokeDasharray="5 4" strokeWidth={1} />
            <text x={X(r.pts[1].x) - 4} y={Y(r.pts[1].y) - 5} textAnchor="end" fontSize={11} fill={COLORS.muted}>{r.label}</text>
          </g>
        ))}
        {power.weberSlope !== null && mid && mid.amount !== null ? <LinePath data={line(power.weberSlope, { x: mid.basePrice, y: mid.amount })} x={(d) => X(d.x)} y={(d) => Y(d.y)} stroke={COLORS.teal} strokeWidth={2} /> : null}
        {pts.map((p) => p.ci ? <line key={`ci${p.x}`} x1={X(p.x)} x2={X(p.x)} y1={Y(clipY(p.ci[0]))} y2={Y(clipY(p.ci[1]))} stroke={COLORS.amber} strokeWidth={1.5} /> : null)}
        {pts.map((p) => <rect key={`p${p.x}`} x={X(p.x) - 4} y={Y(p.y) - 4} width={8} height={8} fill={COLORS.amber} stroke="#fff" strokeWidth={0.8} />)}
        {bounds.map((b) => (
          <path key={`b${b.x}`} d={b.kind === 'above' ? `M${X(b.x) - 5},${Y(b.y) + 4} L${X(b.x) + 5},${Y(b.y) + 4} L${X(b.x)},${Y(b.y) - 5} Z` : `M${X(b.x) - 5},${Y(b.y) - 4} L${X(b.x) + 5},${Y(b.y) - 4} L${X(b.x)},${Y(b.y) + 5} Z`}
            fill="none" stroke={COLORS.brick} strokeWidth={1.5} />
        ))}
        <AxisLeft scale={y} tickValues={yTicks} tickFormat={(v) => fmt(Number(v))} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'end', dx: -2, dy: '0.33em' }} />
        <AxisBottom top={innerH} scale={x} tickValues={xTicks} tickFormat={(v) => fmt(Number(v))} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'middle' }} />
        <text x={innerW / 2} y={innerH + 38} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Base price ({currency}, log scale)</text>
      </Group>
      <text transform={`translate(12, ${M.top + innerH / 2}) rotate(-90)`} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Notice threshold ({currency}, log)</text>
    </svg>
  );
}
