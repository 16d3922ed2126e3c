// Display formatting for plan screens: shares as %, the target in words (money: lib/money.ts).

export function formatPct(v: number | null, digits = 1): string {
  if (v === null || !Number.isFinite(v)) return '—';
  return `${(v * 100).toFixed(digits)} %`;
}

export function formatTarget(target: number | null): string {
  return target === null ? 'Mid-point of the curve' : `${Number((target * 100).toFixed(1))} % notice the saving`;
}
