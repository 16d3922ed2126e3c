'use client';
import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { ParentSize } from '@visx/responsive';
import { scaleLinear, scaleLog } from '@visx/scale';
import { Area, LinePath } from '@visx/shape';
import type { BaseReport } from '@/lib/psychometrics/report-types';
import { alphaFromThreshold, noticeRate, rateAtF, wilson } from '@/lib/psychometrics/curve';
import { boundText, thresholdOf } from '@/lib/results-text';
import { COLORS, clampLabelX, formatNumber, labelWidth, spacedLogTicks } from './chart-theme';

// One base price: observed notice rates per rung (amber dots, area ∝ trials, Wilson 95 %
// whiskers), the fitted curve (teal) with the report's pointwise bootstrap band (`band`, the
// same resampled samples as the intervals; no band when the report has none), and the notice
// threshold as a short tick with its interval. Plain visx pieces drawn once (no animation).
// Layout rules: axis titles sit outside the tick labels (the y title rotated at the far left),
// the threshold label lives in a strip above the plot (never on dots) and is kept inside the
// chart, x ticks are thinned by their label widths, and every card of a study gets the same
// x domain (sharedDiscountDomain) so cards compare by eye. A threshold the data only bound has
// no tick and no curve, only its bound in words.

import type { ObservedCell } from './chart-domain';

export type { ObservedCell };
type Pt = { x: number; y: number };

const r2 = (v: number) => Math.round(v * 100) / 100;
const M = { top: 34, right: 14, bottom: 44, left: 58 };
const FONT = 'var(--font-mono), monospace';

export interface CurveProps {
  base: BaseReport;
  cells: ObservedCell[];
  fTarget: number;
  /** Shared x domain in % of the base price. */
  domain: [number, number];
  /** Fixed width (print); without it the chart fills its container. */
  width?: number;
  height?: number;
  title: string;
}

export function PsychometricCurve(props: CurveProps) {
  const height = props.height ?? 280;
  const caption = (
    <figcaption className="hint">
      Amber dots: observed notice rate per rung (area ∝ trials; whiskers: Wilson 95 % interval). Teal line: fitted curve
      {props.base.band?.length ? '; band: pointwise 95 % band of the curve from the bootstrap samples behind the intervals' : ' (no curve band in this report)'}.
      Black tick: notice threshold with its 95 % interval.
    </figcaption>
  );
  return (
    <figure aria-label={props.title} data-testid="curve-figure">
      {props.width ? <CurveSvg {...props} width={props.width} height={height} /> : (
        <div style={{ height }}>
          <ParentSize debounceTime={50}>{({ width }) => (width > 0 ? <CurveSvg {...props} width={width} height={height} /> : null)}</ParentSize>
        </div>
      )}
      {caption}
    </figure>
  );
}

function CurveSvg({ base, cells, fTarget, domain, width, height }: CurveProps & { width: number; height: number }) {
  const [lo, hi] = domain;
  const innerW = Math.max(60, width - M.left - M.right), innerH = height - M.top - M.bottom;
  const xs = scaleLog({ domain, range: [0, innerW] });
  const ys = scaleLinear({ domain: [0, 1], range: [innerH, 0] });
  // Rounded so the server render and the browser's hydration agree to the last digit.
  const x = (v: number) => r2(Number(xs(v)));
  const y = (v: number) => r2(Number(ys(v)));
  const inside = (v: number) => v >= lo && v <= hi;
  const clampX = (v: number) => Math.min(hi, Math.max(lo, v));
  const t = thresholdOf(base);
  const pts = cells.map((c) => ({ ...c, x: c.discount * 100, y: c.n ? c.k / c.n : 0 })).filter((p) => inside(p.x));
  const nMax = Math.max(1, ...pts.map((p) => p.n));
  const curve: Pt[] = [];
  if (t.fraction !== null && Number.isFinite(base.slope)) {
    const alpha = alphaFromThreshold(t.fraction, base.slope, fTarget);
    for (let i = 0; i <= 96; i++) {
      const v = lo * Math.pow(hi / lo, i / 96);
      curve.push({ x: v, y: noticeRate(v / 100, { guess: base.guess, lapse: base.lapse, alpha, beta: base.slope }) });
    }
  }
  const band = (base.band ?? []).map((p) => ({ x: p.discount * 100, lo: p.lo, hi: p.hi })).filter((p) => inside(p.x));
  const fmt = (v: number) => formatNumber(v);
  const ticks = spacedLogTicks(lo, hi, (v) => (x(v)), fmt, 10);
  const thresholdY = rateAtF(fTarget, base.guess, base.lapse);
  const label = t.bound ? boundText(t.bound) : t.fraction !== null ? `threshold ${(t.fraction * 100).toFixed(1)} %` : 'no threshold';
  const lw = labelWidth(label);
  const anchorX = t.fraction !== null ? (x(clampX(t.fraction * 100))) : t.bound?.kind === 'below' ? 0 : innerW;
  const labelX = clampLabelX(anchorX, lw, -M.left + 4, innerW + M.right - 4);
  return (
    <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} style={{ maxWidth: "100%", height: "auto" }} role="img" aria-label={`Notice rate against discount at base price ${base.basePrice}; ${label}`}>
      <Group left={M.left} top={M.top}>
        {[0.2, 0.4, 0.6, 0.8, 1].map((v) => <line key={v} x1={0} x2={innerW} y1={y(v)} y2={y(v)} stroke={COLORS.rule} />)}
        {t.fraction !== null ? <line x1={anchorX} x2={anchorX} y1={-12} y2={y(thresholdY) - 10} stroke={COLORS.muted} strokeWidth={0.8} strokeDasharray="2 3" /> : null}
        {band.length > 1 ? <Area data={band} x={(d) => (x(d.x))} y0={(d) => y(d.lo)} y1={(d) => y(d.hi)} fill={COLORS.teal} fillOpacity={0.14} data-testid="curve-band" /> : null}
        {pts.map((c) => {
          const [wlo, whi] = wilson(c.k, c.n);
          return <line key={`w${c.x}`} x1={x(c.x)} x2={x(c.x)} y1={y(wlo)} y2={y(whi)} stroke={COLORS.amber} strokeWidth={1.2} />;
        })}
        {curve.length ? <LinePath data={curve} x={(d) => (x(d.x))} y={(d) => y(d.y)} stroke={COLORS.teal} strokeWidth={2} /> : null}
        {pts.map((c) => <circle key={`d${c.x}`} cx={x(c.x)} cy={y(c.y)} r={2 + 7 * Math.sqrt(c.n / nMax)} fill={COLORS.amber} fillOpacity={0.85} stroke="#fff" strokeWidth={0.8} />)}
        {t.fraction !== null ? (
          <g data-testid="threshold-tick">
            {t.fractionCi ? <line x1={x(clampX(t.fractionCi[0] * 100))} x2={x(clampX(t.fractionCi[1] * 100))} y1={y(thresholdY)} y2={y(thresholdY)} stroke={COLORS.ink} strokeWidth={1.5} /> : null}
            {inside(t.fraction * 100) ? <line x1={x(t.fraction * 100)} x2={x(t.fraction * 100)} y1={y(thresholdY) - 9} y2={y(thresholdY) + 9} stroke={COLORS.ink} strokeWidth={2} /> : null}
          </g>
        ) : null}
        <text data-testid="threshold-label" x={labelX} y={-18} textAnchor="middle" fontSize={11} fill={t.bound ? COLORS.brick : COLORS.ink} fontFamily={FONT}>{label}</text>
        <AxisLeft scale={ys} tickValues={[0, 0.2, 0.4, 0.6, 0.8, 1]} tickFormat={(v) => `${Math.round(Number(v) * 100)} %`} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'end', dx: -2, dy: '0.33em' }} />
        <AxisBottom top={innerH} scale={xs} tickValues={ticks} tickFormat={(v) => fmt(Number(v))} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'middle' }} />
        <text x={innerW / 2} y={innerH + 38} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Discount (% of base price, log scale)</text>
      </Group>
      <text transform={`translate(12, ${M.top + innerH / 2}) rotate(-90)`} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Notice rate</text>
    </svg>
  );
}
