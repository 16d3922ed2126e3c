import type { PlanSummary } from '@/lib/promo/summary';
import { FLAGS } from '@/lib/promo/flags';
import { formatPct } from '@/lib/promo/format';
import { formatMoney } from '@/lib/money';

/**
 * The plan at a glance: the average floor and the average discount actually given side by
 * side (an ending that deepens discounts shows at once), the margin the plan costs, and the flags.
 */
export function PlanSummaryCard({ summary, currency, locale }: { summary: PlanSummary; currency: string; locale: string }) {
  const n = (v: number) => v.toLocaleString('en-GB');
  const gap = summary.averageFloor !== null && summary.averageDiscountAfterEnding !== null ? summary.averageDiscountAfterEnding - summary.averageFloor : null;
  const cells: [string, string, string?][] = [
    ['Items', n(summary.items)],
    ['Average promo floor', formatPct(summary.averageFloor)],
    ['Average discount given', formatPct(summary.averageDiscountAfterEnding), gap !== null ? `${(gap * 100).toFixed(1)} points deeper than the floor` : undefined],
    ['Margin cost, one unit of each item', formatMoney(summary.totalMarginCost, currency, locale), `of which the price ending adds ${formatMoney(summary.endingMarginCost, currency, locale)}`],
    [`${FLAGS.endingSkipped.mark} ${FLAGS.endingSkipped.label}`, n(summary.endingSkipped), 'ending too deep for the tolerance'],
    [`${FLAGS.noThreshold.mark} ${FLAGS.noThreshold.label}`, n(summary.noThreshold), 'bound only: no floor given'],
    [`${FLAGS.outsideRange.mark} ${FLAGS.outsideRange.label}`, n(summary.outsideRange)],
    [`${FLAGS.deeperThanMargin.mark} ${FLAGS.deeperThanMargin.label}`, n(summary.deeperThanMargin), `of ${n(summary.withUnitCost)} with unit cost`],
    [`${FLAGS.noPromoPrice.mark} ${FLAGS.noPromoPrice.label}`, n(summary.noPromoPrice)],
  ];
  return (
    <section aria-label="Plan summary" className="card grid grid-cols-2 divide-rule sm:grid-cols-3" data-testid="plan-summary">
      {cells.map(([label, value, note]) => (
        <div key={label} className="border-b border-r border-rule p-3">
          <div className="text-xs text-muted">{label}</div>
          <div className="num text-lg">{value}</div>
          {note ? <div className="text-xs text-muted">{note}</div> : null}
        </div>
      ))}
    </section>
  );
}
