import { buildChartTheme } from '@visx/xychart';

// Palette roles from DESIGN.md: teal for the fitted curve, amber for what was noticed.
export const COLORS = { teal: '#0F6E6E', tealLight: '#E3F0EF', amber: '#C77C02', ink: '#1F2430', muted: '#5B6170', rule: '#E4DED4', brick: '#A4402A' };

export const chartTheme = buildChartTheme({
  backgroundColor: 'transparent',
  colors: [COLORS.teal, COLORS.amber, COLORS.muted],
  gridColor: COLORS.rule,
  gridColorDark: COLORS.muted,
  tickLength: 4,
  svgLabelSmall: { fill: COLORS.muted, fontSize: 11, fontFamily: 'var(--font-mono), monospace' },
  svgLabelBig: { fill: COLORS.ink, fontSize: 12, fontFamily: 'var(--font-sans), sans-serif' },
});

/** Readable ticks for a log axis: 1-2-5 style values (and 3) inside the domain. */
export function logTicks(lo: number, hi: number, steps = [1, 2, 3, 5]): number[] {
  const out: number[] = [];
  for (let e = Math.floor(Math.log10(lo)) - 1; e <= Math.ceil(Math.log10(hi)) + 1; e++) {
    for (const s of steps) {
      const v = s * 10 ** e;
      if (v >= lo && v <= hi) out.push(Number(v.toPrecision(6)));
    }
  }
  return out;
}

export const formatNumber = (v: number) => (v >= 1 ? String(Number(v.toPrecision(3))) : String(Number(v.toPrecision(2))));

/** Approximate width in px of a label in the charts' 11 px mono face (0.6 em per character). */
export const labelWidth = (text: string, fontSize = 11) => text.length * fontSize * 0.6;

/**
 * Log-axis ticks that never collide: the 1-2-3-5 candidates in the domain, keeping a tick only
 * when its label clears every kept one by `gap` px.
 */
export function spacedLogTicks(lo: number, hi: number, toPx: (v: number) => number, fmt: (v: number) => string, gap = 8): number[] {
  // Powers of ten first, then 5s, 2s and 3s: crowded axes keep the roundest values.
  const rank = (v: number) => [1, 5, 2, 3].indexOf(Math.round(v / 10 ** Math.floor(Math.log10(v) + 1e-9)));
  const ordered = logTicks(lo, hi).sort((x, y) => rank(x) - rank(y) || x - y);
  const kept: { v: number; a: number; b: number }[] = [];
  for (const v of ordered) {
    const w = labelWidth(fmt(v)), c = toPx(v);
    const a = c - w / 2 - gap / 2, b = c + w / 2 + gap / 2;
    if (kept.every((k) => b <= k.a || a >= k.b)) kept.push({ v, a, b });
  }
  return kept.map((k) => k.v).sort((x, y) => x - y);
}

/** x for a centred label of `width` px kept inside [min, max]. */
export const clampLabelX = (x: number, width: number, min: number, max: number) => Math.min(max - width / 2, Math.max(min + width / 2, x));
