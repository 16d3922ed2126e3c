'use client';
import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { scaleLinear, scaleLog } from '@visx/scale';
import { LinePath } from '@visx/shape';
import type { PromoChartData } from '@/lib/promo/chart-data';
import { COLORS, formatNumber, logTicks } from './chart-theme';

// Promo floor (% off) against regular price (log axis) for a plan's price list: the model's
// floor as a teal line, items at their promo price as amber dots (flagged ones as hollow
// diamonds), the tested base prices as ▽ marks on a dashed rule, and the range outside the
// tested prices shaded and labelled. Plain (non-animated) visx pieces, drawn once.

const W = 760, H = 320;
const M = { top: 34, right: 18, bottom: 46, left: 56 };

export function PromoFloorChart({ data, currency }: { data: PromoChartData; currency: string }) {
  const prices = [...data.curve.map((c) => c.price), ...data.items.map((i) => i.price)];
  const lo = Math.min(...prices) / 1.15, hi = Math.max(...prices) * 1.15;
  const yMax = Math.min(1, Math.max(0.05, ...data.curve.map((c) => c.floor), ...data.items.map((i) => i.discount)) * 1.1);
  const x = scaleLog({ domain: [lo, hi], range: [0, W - M.left - M.right] });
  const y = scaleLinear({ domain: [0, yMax], range: [H - M.top - M.bottom, 0], nice: true });
  const innerH = H - M.top - M.bottom;
  const tested = data.testedBasePrices;
  const tLo = x(tested[0]), tHi = x(tested[tested.length - 1]);
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label={`Promo floor in percent against regular price in ${currency}, log scale; tested base prices ${tested.join(', ')}`} data-testid="promo-floor-chart">
      <Group left={M.left} top={M.top}>
        {tLo > 0 ? <rect x={0} y={0} width={tLo} height={innerH} fill={COLORS.rule} opacity={0.45} /> : null}
        {tHi < x(hi) ? <rect x={tHi} y={0} width={x(hi) - tHi} height={innerH} fill={COLORS.rule} opacity={0.45} /> : null}
        {tLo > 60 ? <text x={4} y={12} fontSize={10} fill={COLORS.muted}>outside tested range</text> : null}
        {x(hi) - tHi > 60 ? <text x={x(hi) - 4} y={12} fontSize={10} fill={COLORS.muted} textAnchor="end">outside tested range</text> : null}
        {y.ticks(5).map((t) => <line key={t} x1={0} x2={x(hi)} y1={y(t)} y2={y(t)} stroke={COLORS.rule} strokeWidth={1} />)}
        {tested.map((b) => (
          <g key={b}>
            <line x1={x(b)} x2={x(b)} y1={0} y2={innerH} stroke={COLORS.muted} strokeDasharray="3 4" strokeWidth={1} />
            <path d={`M${x(b) - 5},${innerH - 9} L${x(b) + 5},${innerH - 9} L${x(b)},${innerH - 1} Z`} fill="none" stroke={COLORS.ink} strokeWidth={1.2} />
          </g>
        ))}
        {data.items.map((p, i) => p.flagged ? (
          <path key={i} d={`M${x(p.price)},${y(p.discount) - 3.5} l3.5,3.5 l-3.5,3.5 l-3.5,-3.5 Z`} fill="none" stroke={COLORS.brick} strokeWidth={1} />
        ) : (
          <circle key={i} cx={x(p.price)} cy={y(p.discount)} r={2.4} fill={COLORS.amber} fillOpacity={0.75} />
        ))}
        <LinePath data={data.curve} x={(d) => x(d.price)} y={(d) => y(d.floor)} stroke={COLORS.teal} strokeWidth={2.2} />
        <AxisBottom top={innerH} scale={x} tickValues={logTicks(lo, hi, [1, 2, 5])} tickFormat={(v) => formatNumber(Number(v))}
          label={`Regular price (${currency}, log scale)`} stroke={COLORS.muted} tickStroke={COLORS.muted}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: 'var(--font-mono), monospace' }} labelProps={{ fill: COLORS.ink, fontSize: 12, textAnchor: 'middle' }} />
        <AxisLeft scale={y} numTicks={5} tickFormat={(v) => `${Math.round(Number(v) * 100)} %`}
          label="Promo floor (% off)" stroke={COLORS.muted} tickStroke={COLORS.muted}
          tickLabelProps={{ fill: COLORS.muted, fontSize: 11, fontFamily: 'var(--font-mono), monospace', textAnchor: 'end', dx: -4, dy: 3 }} labelProps={{ fill: COLORS.ink, fontSize: 12, textAnchor: 'middle' }} />
      </Group>
      <g transform={`translate(${M.left + 8}, 16)`} fontSize={11} fill={COLORS.ink}>
        <line x1={0} x2={18} y1={-4} y2={-4} stroke={COLORS.teal} strokeWidth={2.2} /><text x={22} y={0}>model floor</text>
        <circle cx={112} cy={-4} r={2.6} fill={COLORS.amber} /><text x={118} y={0}>item at promo price</text>
        <path d="M252,-7.5 l3.5,3.5 l-3.5,3.5 l-3.5,-3.5 Z" fill="none" stroke={COLORS.brick} /><text x={260} y={0}>flagged item</text>
        <path d="M352,-9 L362,-9 L357,-1 Z" fill="none" stroke={COLORS.ink} /><text x={366} y={0}>tested base price</text>
      </g>
    </svg>
  );
}
