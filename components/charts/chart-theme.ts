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
