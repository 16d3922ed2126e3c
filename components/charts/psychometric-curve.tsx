'use client';
import { useContext } from 'react';
import { Axis, DataContext, GlyphSeries, Grid, LineSeries, XYChart } from '@visx/xychart';
import { Area } from '@visx/shape';
import type { BaseReport } from '@/lib/psychometrics/report-types';
import { alphaFromThreshold, noticeRate, rateAtF, wilson } from '@/lib/psychometrics/curve';
import { thresholdText } from '@/lib/results-text';
import { COLORS, chartTheme, formatNumber, logTicks } from './chart-theme';

// One base price: observed notice rates per rung (amber dots, area ∝ trials, Wilson 95 %
// whiskers), the fitted curve (teal) with a band, and the notice threshold as a short tick with
// its bootstrap interval. The band is the envelope of the curves through the ends of the
// threshold and slope intervals (the report carries intervals, not bootstrap curves).

export interface ObservedCell { discount: number; n: number; k: number }
type Pt = { x: number; y: number };

function curveAt(b: BaseReport, alpha: number, beta: number, xPct: number) {
  return noticeRate(xPct / 100, { guess: b.guess, lapse: b.lapse, alpha, beta });
}

function Overlay({ band, cells, b, thresholdY, label }: { band: { x: number; lo: number; hi: number }[]; cells: (ObservedCell & { x: number })[]; b: BaseReport; thresholdY: number; label: string }) {
  const { xScale, yScale } = useContext(DataContext);
  if (!xScale || !yScale) return null;
  const X = (v: number) => Number(xScale(v));
  const Y = (v: number) => Number(yScale(v));
  const t = b.threshold;
  // A bound (fraction null) is marked at the rung it names; the label says "above" / "below".
  const mark = t.fraction ?? t.bound?.fraction ?? NaN;
  return (
    <g>
      <Area data={band} x={(d) => X(d.x)} y0={(d) => Y(d.lo)} y1={(d) => Y(d.hi)} fill={COLORS.teal} fillOpacity={0.12} />
      {cells.map((c) => {
        const [lo, hi] = wilson(c.k, c.n);
        return <line key={c.x} x1={X(c.x)} x2={X(c.x)} y1={Y(lo)} y2={Y(hi)} stroke={COLORS.amber} strokeWidth={1.2} />;
      })}
      {t.fractionCi ? (
        <line x1={X(t.fractionCi[0] * 100)} x2={X(t.fractionCi[1] * 100)} y1={Y(thresholdY)} y2={Y(thresholdY)} stroke={COLORS.ink} strokeWidth={1.5} />
      ) : null}
      <line x1={X(mark * 100)} x2={X(mark * 100)} y1={Y(thresholdY) - 9} y2={Y(thresholdY) + 9} stroke={COLORS.ink} strokeWidth={2} />
      <text x={X(mark * 100) + 5} y={Y(thresholdY) - 12} fontSize={11} fill={COLORS.ink} fontFamily="var(--font-mono), monospace">{label}</text>
    </g>
  );
}

export function PsychometricCurve({ base, cells, fTarget, width = 440, height = 280, title }: { base: BaseReport; cells: ObservedCell[]; fTarget: number; width?: number; height?: number; title: string }) {
  const pts = cells.map((c) => ({ ...c, x: c.discount * 100, y: c.n ? c.k / c.n : 0 }));
  const xs = pts.map((p) => p.x).concat(base.threshold.fractionCi ? base.threshold.fractionCi.map((v) => v * 100) : []);
  const lo = Math.max(0.05, Math.min(...xs) / 1.5), hi = Math.min(99, Math.max(...xs) * 1.5);
  const alpha = alphaFromThreshold(base.threshold.fraction ?? base.threshold.bound?.fraction ?? NaN, base.slope, fTarget);
  const curve: Pt[] = [];
  const band: { x: number; lo: number; hi: number }[] = [];
  const ci = base.threshold.fractionCi, sci = base.slopeCi;
  const corners = ci && sci ? ci.flatMap((f) => sci.map((s) => ({ a: alphaFromThreshold(f, s, fTarget), s }))) : [];
  for (let i = 0; i <= 80; i++) {
    const x = lo * Math.pow(hi / lo, i / 80);
    curve.push({ x, y: curveAt(base, alpha, base.slope, x) });
    if (corners.length) {
      const ys = corners.map((c) => curveAt(base, c.a, c.s, x));
      band.push({ x, lo: Math.min(...ys), hi: Math.max(...ys) });
    }
  }
  const nMax = Math.max(1, ...pts.map((p) => p.n));
  const thresholdY = rateAtF(fTarget, base.guess, base.lapse);
  return (
    <figure aria-label={title}>
      <XYChart width={width} height={height} margin={{ top: 18, right: 14, bottom: 46, left: 50 }} theme={chartTheme}
        xScale={{ type: 'log', domain: [lo, hi] }} yScale={{ type: 'linear', domain: [0, 1] }}>
        <Grid columns={false} numTicks={5} />
        <Axis orientation="bottom" label="Discount (% of base price, log scale)" tickValues={logTicks(lo, hi)} tickFormat={(v) => `${formatNumber(Number(v))}`} />
        <Axis orientation="left" label="Notice rate" numTicks={5} tickFormat={(v) => `${Math.round(Number(v) * 100)} %`} />
        <Overlay band={band} cells={pts} b={base} thresholdY={thresholdY} label={`threshold ${thresholdText(base.threshold, (f) => `${(f * 100).toFixed(1)} %`)}`} />
        <LineSeries dataKey="fitted curve" data={curve} xAccessor={(d: Pt) => d.x} yAccessor={(d: Pt) => d.y} stroke={COLORS.teal} strokeWidth={2} />
        <GlyphSeries dataKey="observed" data={pts} xAccessor={(d) => d.x} yAccessor={(d) => d.y}
          renderGlyph={({ x, y, datum }) => <circle cx={x} cy={y} r={2 + 7 * Math.sqrt(datum.n / nMax)} fill={COLORS.amber} fillOpacity={0.85} stroke="#fff" strokeWidth={0.8} />} />
      </XYChart>
      <figcaption className="hint">
        Amber dots: observed notice rate per rung (area ∝ trials; whiskers: Wilson 95 % interval). Teal line: fitted curve; band: curves through the ends of the threshold and slope intervals. Black tick: notice threshold with its bootstrap interval.
      </figcaption>
    </figure>
  );
}
