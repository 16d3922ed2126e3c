'use client';
import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { ParentSize } from '@visx/responsive';
import { scaleLog } from '@visx/scale';
import { COLORS, formatNumber, spacedLogTicks } from './chart-theme';
import { CategoryMark } from './category-mark';
import type { CategoryShape } from '@/lib/record/record';

// The threshold record's chart: every study's notice thresholds in money against base price,
// both on log axes, one colour and one mark shape per category (never colour alone), each
// study's fitted power line over the base prices it tested (thin, in its category's colour),
// and the two Weber reference lines through the middle of all the points: slope 1 (Weber's law,
// the same percentage at every price) and slope 0 (the same amount at every price). Thresholds
// the data only bound are left to the table (their number is unknown).

export interface RecordChartPoint { studyId: string; basePrice: number; amount: number; ci: [number, number] | null; category: string }
export interface RecordChartLine { studyId: string; category: string; from: number; to: number; a: number; b: number }
export interface RecordChartCategory { category: string; colour: string; shape: CategoryShape }

const M = { top: 16, right: 16, bottom: 46, left: 66 };
const FONT = 'var(--font-mono), monospace';

type Props = { points: RecordChartPoint[]; lines: RecordChartLine[]; categories: RecordChartCategory[]; currency: string; height?: number; width?: number };

export function RecordChart(props: Props) {
  const height = props.height ?? 380;
  return (
    <figure aria-label="Thresholds of every study" data-testid="record-chart" className="min-w-0">
      {props.width ? <RecordSvg {...props} width={props.width} height={height} /> : (
        <div style={{ height }}>
          <ParentSize debounceTime={50}>{({ width: w }) => (w > 0 ? <RecordSvg {...props} width={Math.min(w, 760)} height={height} /> : null)}</ParentSize>
        </div>
      )}
      <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-label="Categories">
        {props.categories.map((c) => (
          <li key={c.category} className="flex items-center gap-1.5">
            <svg width={12} height={12} aria-hidden="true"><CategoryMark shape={c.shape} colour={c.colour} x={6} y={6} size={5} /></svg>{c.category}
          </li>
        ))}
      </ul>
      <figcaption className="hint">
        Each mark: one study&apos;s notice threshold at one tested base price, with its 95 % interval; thin lines: each study&apos;s fitted Weber line over the prices it tested. Dashed: Weber&apos;s law (same percentage, slope 1) and the same amount at every price (slope 0), through the middle of the points.
      </figcaption>
    </figure>
  );
}

function RecordSvg({ points, lines, categories, currency, width, height }: Props & { width: number; height: number }) {
  if (!points.length) return <p className="hint">No study in this selection has a threshold to plot.</p>;
  const style = (cat: string) => categories.find((c) => c.category === cat) ?? { colour: COLORS.muted, shape: 'circle' as const };
  const xs = points.map((p) => p.basePrice), ys = points.flatMap((p) => [p.amount, ...(p.ci ?? [])]).filter((v) => v > 0);
  const xLo = Math.min(...xs) / 1.6, xHi = Math.max(...xs) * 1.6;
  const yLo = Math.min(...ys) / 1.6, yHi = Math.max(...ys) * 1.6;
  const innerW = Math.max(80, width - M.left - M.right), innerH = height - M.top - M.bottom;
  const x = scaleLog({ domain: [xLo, xHi], range: [0, innerW] });
  const y = scaleLog({ domain: [yLo, yHi], range: [innerH, 0] });
  // Rounded so the server render and the browser's hydration agree.
  const X = (v: number) => Math.round(Number(x(v)) * 100) / 100, Y = (v: number) => Math.round(Number(y(Math.min(yHi, Math.max(yLo, v)))) * 100) / 100;
  const gx = Math.exp(xs.reduce((s, v) => s + Math.log(v), 0) / xs.length);
  const gy = Math.exp(points.reduce((s, p) => s + Math.log(p.amount), 0) / points.length);
  const refs = [
    { label: "Weber's law (slope 1)", slope: 1 },
    { label: 'same amount (slope 0)', slope: 0 },
  ].map((r) => ({ ...r, y0: gy * Math.pow(xLo / gx, r.slope), y1: gy * Math.pow(xHi / gx, r.slope) }));
  const fmt = (v: number) => formatNumber(v);
  const xTicks = spacedLogTicks(xLo, xHi, (v) => Number(x(v)), fmt);
  const yTicks = spacedLogTicks(yLo, yHi, (v) => Number(y(v)), () => 'xx', 10).filter((v, i, a) => i === 0 || Math.abs(Number(y(v)) - Number(y(a[i - 1]))) > 14);
  return (
    <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} style={{ maxWidth: '100%', height: 'auto' }} role="img" aria-label={`Notice thresholds in ${currency} against base price, both on log scales, ${points.length} thresholds`}>
      <Group left={M.left} top={M.top}>
        {refs.map((r) => (
          <g key={r.label}>
            <line x1={X(xLo)} y1={Y(r.y0)} x2={X(xHi)} y2={Y(r.y1)} stroke={COLORS.muted} strokeDasharray="5 4" strokeWidth={1} />
            <text x={X(xHi) - 4} y={Y(r.y1) - 5} textAnchor="end" fontSize={11} fill={COLORS.muted}>{r.label}</text>
          </g>
        ))}
        {lines.map((l) => (
          <line key={`l${l.studyId}`} x1={X(l.from)} y1={Y(Math.exp(l.a + l.b * Math.log(l.from)))} x2={X(l.to)} y2={Y(Math.exp(l.a + l.b * Math.log(l.to)))} stroke={style(l.category).colour} strokeOpacity={0.55} strokeWidth={1.2} />
        ))}
        {points.map((p) => p.ci ? <line key={`c${p.studyId}${p.basePrice}`} x1={X(p.basePrice)} x2={X(p.basePrice)} y1={Y(p.ci[0])} y2={Y(p.ci[1])} stroke={style(p.category).colour} strokeOpacity={0.7} strokeWidth={1.2} /> : null)}
        {points.map((p) => <CategoryMark key={`p${p.studyId}${p.basePrice}`} shape={style(p.category).shape} colour={style(p.category).colour} x={X(p.basePrice)} y={Y(p.amount)} size={4.5} />)}
        <AxisLeft scale={y} tickValues={yTicks} tickFormat={(v) => fmt(Number(v))} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'end', dx: -2, dy: '0.33em' }} />
        <AxisBottom top={innerH} scale={x} tickValues={xTicks} tickFormat={(v) => fmt(Number(v))} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'middle' }} />
        <text x={innerW / 2} y={innerH + 38} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Base price ({currency}, log scale)</text>
      </Group>
      <text transform={`translate(12, ${M.top + innerH / 2}) rotate(-90)`} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Notice threshold ({currency}, log scale)</text>
    </svg>
  );
}
