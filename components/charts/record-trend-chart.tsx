'use client';
import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { ParentSize } from '@visx/responsive';
import { scaleLog, scaleTime } from '@visx/scale';
import { COLORS, formatNumber, spacedLogTicks } from './chart-theme';
import { CategoryMark } from './category-mark';
import type { RecordChartCategory } from './record-chart';

// A line per category measured more than once: each study's threshold at the picked price
// (from its Weber line, with its 95 % interval) against the date the study closed. Log scale
// for the threshold, so equal steps are equal ratios.

export interface TrendSeries { category: string; points: { studyId: string; date: string; amount: number; ci: [number, number] | null }[] }

type Props = { series: TrendSeries[]; categories: RecordChartCategory[]; currency: string; price: string; height?: number; width?: number };

const M = { top: 14, right: 20, bottom: 46, left: 66 };
const FONT = 'var(--font-mono), monospace';

export function RecordTrendChart(props: Props) {
  const height = props.height ?? 280;
  return (
    <figure aria-label="Thresholds over time" data-testid="record-trend-chart" className="min-w-0">
      {props.width ? <TrendSvg {...props} width={props.width} height={height} /> : (
        <div style={{ height }}>
          <ParentSize debounceTime={50}>{({ width: w }) => (w > 0 ? <TrendSvg {...props} width={Math.min(w, 760)} height={height} /> : null)}</ParentSize>
        </div>
      )}
      <figcaption className="hint">Each mark: one study&apos;s notice threshold at {props.price} with its 95 % interval, at the date the study closed.</figcaption>
    </figure>
  );
}

const day = (iso: string) => new Date(iso.slice(0, 10) + 'T12:00:00Z');

function TrendSvg({ series, categories, currency, width, height }: Props & { width: number; height: number }) {
  const all = series.flatMap((s) => s.points);
  if (!all.length) return null;
  const style = (cat: string) => categories.find((c) => c.category === cat) ?? { colour: COLORS.muted, shape: 'circle' as const };
  const times = all.map((p) => day(p.date).getTime());
  const pad = Math.max(15 * 86_400_000, (Math.max(...times) - Math.min(...times)) * 0.08);
  const ys = all.flatMap((p) => [p.amount, ...(p.ci ?? [])]).filter((v) => v > 0);
  const yLo = Math.min(...ys) / 1.4, yHi = Math.max(...ys) * 1.4;
  const innerW = Math.max(80, width - M.left - M.right), innerH = height - M.top - M.bottom;
  const x = scaleTime({ domain: [new Date(Math.min(...times) - pad), new Date(Math.max(...times) + pad)], range: [0, innerW] });
  const y = scaleLog({ domain: [yLo, yHi], range: [innerH, 0] });
  const X = (iso: string) => Math.round(Number(x(day(iso))) * 100) / 100, Y = (v: number) => Math.round(Number(y(v)) * 100) / 100;
  const yTicks = spacedLogTicks(yLo, yHi, (v) => Number(y(v)), () => 'xx', 10).filter((v, i, a) => i === 0 || Math.abs(Number(y(v)) - Number(y(a[i - 1]))) > 14);
  const monthFmt = (d: Date) => d.toLocaleDateString('en-GB', { month: 'short', year: 'numeric', timeZone: 'UTC' });
  return (
    <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} style={{ maxWidth: '100%', height: 'auto' }} role="img" aria-label={`Notice threshold in ${currency} by study date, one line per category`}>
      <Group left={M.left} top={M.top}>
        {series.map((s) => (
          <g key={s.category}>
            <polyline points={s.points.map((p) => `${X(p.date)},${Y(p.amount)}`).join(' ')} fill="none" stroke={style(s.category).colour} strokeWidth={1.6} />
            {s.points.map((p) => p.ci ? <line key={`c${p.studyId}`} x1={X(p.date)} x2={X(p.date)} y1={Y(p.ci[0])} y2={Y(p.ci[1])} stroke={style(s.category).colour} strokeOpacity={0.7} /> : null)}
            {s.points.map((p) => <CategoryMark key={p.studyId} shape={style(s.category).shape} colour={style(s.category).colour} x={X(p.date)} y={Y(p.amount)} size={4.5} />)}
          </g>
        ))}
        <AxisLeft scale={y} tickValues={yTicks} tickFormat={(v) => formatNumber(Number(v))} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'end', dx: -2, dy: '0.33em' }} />
        <AxisBottom top={innerH} scale={x} numTicks={Math.max(2, Math.floor(innerW / 110))} tickFormat={(v) => monthFmt(v as Date)} stroke={COLORS.muted} tickStroke={COLORS.muted} tickLength={4}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: FONT, textAnchor: 'middle' }} />
        <text x={innerW / 2} y={innerH + 38} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Date the study closed</text>
      </Group>
      <text transform={`translate(12, ${M.top + innerH / 2}) rotate(-90)`} textAnchor="middle" fontSize={12} fill={COLORS.ink}>Threshold ({currency}, log scale)</text>
    </svg>
  );
}
