'use client';
import { useContext } from 'react';
import { Axis, DataContext, GlyphSeries, LineSeries, XYChart } from '@visx/xychart';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import { geometricMean } from '@/lib/psychometrics/math';
import { COLORS, chartTheme, formatNumber, logTicks } from './chart-theme';

// Notice threshold in money against base price, both on log axes: each base's threshold with
// its interval (amber), the fitted power line (teal, slope = Weber slope) and two reference
// lines through the middle of the data: slope 1 ("same percentage") and slope 0 ("same amount").

type Pt = { x: number; y: number };

function Overlay({ report, refs, lo, hi }: { report: AnalysisReport; refs: { label: string; pts: Pt[] }[]; lo: number; hi: number }) {
  const { xScale, yScale } = useContext(DataContext);
  if (!xScale || !yScale) return null;
  const X = (v: number) => Number(xScale(v));
  const Y = (v: number) => Number(yScale(v));
  return (
    <g>
      {refs.map((r) => (
        <g key={r.label}>
          <line x1={X(r.pts[0].x)} y1={Y(r.pts[0].y)} x2={X(r.pts[1].x)} y2={Y(r.pts[1].y)} stroke={COLORS.muted} strokeDasharray="5 4" strokeWidth={1} />
          <text x={X(r.pts[1].x) - 4} y={Y(r.pts[1].y) - 5} textAnchor="end" fontSize={11} fill={COLORS.muted}>{r.label}</text>
        </g>
      ))}
      {report.bases.map((b) => b.threshold.amountCi ? (
        <line key={b.basePrice} x1={X(b.basePrice)} x2={X(b.basePrice)} y1={Y(Math.max(lo, b.threshold.amountCi[0]))} y2={Y(Math.min(hi, b.threshold.amountCi[1]))} stroke={COLORS.amber} strokeWidth={1.5} />
      ) : null)}
    </g>
  );
}

export function WeberPlot({ report, currency, width = 560, height = 340 }: { report: AnalysisReport; currency: string; width?: number; height?: number }) {
  // Bases whose threshold is only a bound (amount null) have no square to draw.
  const pts = report.bases.flatMap((b) => (b.threshold.amount === null ? [] : [{ x: b.basePrice, y: b.threshold.amount }]));
  const prices = report.bases.map((b) => b.basePrice);
  const amounts = report.bases.flatMap((b) => [b.threshold.amount ?? NaN, ...(b.threshold.amountCi ?? [])]).filter((v) => v > 0);
  const xLo = Math.min(...prices) / 1.6, xHi = Math.max(...prices) * 1.6;
  const yLo = Math.min(...amounts) / 2, yHi = Math.max(...amounts) * 2;
  const power = report.models.power;
  const slope = power.weberSlope ?? 1;
  // Through the power model's own threshold at the middle base (a straight line on log–log axes).
  const midT = power.thresholds[Math.floor(power.thresholds.length / 2)];
  const mid = midT ? { basePrice: midT.basePrice, amount: midT.amount ?? (midT.bound ? midT.bound.fraction * midT.basePrice : NaN) } : { basePrice: pts[0]?.x ?? prices[0], amount: pts[0]?.y ?? NaN };
  const line = (s: number, through: Pt): Pt[] => [xLo, xHi].map((x) => ({ x, y: through.y * Math.pow(x / through.x, s) }));
  const clip = (ps: Pt[]) => ps.map((p) => ({ x: p.x, y: Math.min(yHi, Math.max(yLo, p.y)) }));
  const gm = { x: geometricMean(prices), y: geometricMean(pts.map((p) => p.y)) };
  const refs = [
    { label: 'same percentage (slope 1)', pts: clip(line(1, gm)) },
    { label: 'same amount (slope 0)', pts: clip(line(0, gm)) },
  ];
  return (
    <figure aria-label="Weber view">
      <XYChart width={width} height={height} margin={{ top: 16, right: 16, bottom: 46, left: 62 }} theme={chartTheme}
        xScale={{ type: 'log', domain: [xLo, xHi] }} yScale={{ type: 'log', domain: [yLo, yHi] }}>
        <Axis orientation="bottom" label={`Base price (${currency}, log scale)`} tickValues={logTicks(xLo, xHi, [1, 2, 5])} tickFormat={(v) => formatNumber(Number(v))} />
        <Axis orientation="left" label={`Notice threshold (${currency}, log scale)`} tickValues={logTicks(yLo, yHi, [1, 2, 5])} tickFormat={(v) => formatNumber(Number(v))} />
        <Overlay report={report} refs={refs} lo={yLo} hi={yHi} />
        {power.weberSlope !== null ? (
          <LineSeries dataKey="power fit" data={clip(line(slope, { x: mid.basePrice, y: mid.amount }))} xAccessor={(d: Pt) => d.x} yAccessor={(d: Pt) => d.y} stroke={COLORS.teal} strokeWidth={2} />
        ) : null}
        <GlyphSeries dataKey="thresholds" data={pts} xAccessor={(d) => d.x} yAccessor={(d) => d.y}
          renderGlyph={({ x, y }) => <rect x={x - 4} y={y - 4} width={8} height={8} fill={COLORS.amber} stroke="#fff" strokeWidth={0.8} />} />
      </XYChart>
      <figcaption className="hint">
        Amber squares: each base price&apos;s notice threshold with its bootstrap interval. Teal line: fitted power model (slope = Weber slope). Dashed: the reference lines.
      </figcaption>
    </figure>
  );
}
