import type { PlanSummary } from '@/lib/promo/summary';
import { FLAGS } from '@/lib/promo/flags';
import { formatPct } from '@/lib/promo/format';

export function PlanSummaryCard({ summary }: { summary: PlanSummary }) {
  const cells: [string, string, string?][] = [
    ['Items', summary.items.toLocaleString('en-GB')],
    ['Average promo floor', formatPct(summary.averageFloor)],
    ['Average discount at promo price', formatPct(summary.averageDiscountAfterEnding)],
    [`${FLAGS.outsideRange.mark} ${FLAGS.outsideRange.label}`, summary.outsideRange.toLocaleString('en-GB')],
    [`${FLAGS.deeperThanMargin.mark} ${FLAGS.deeperThanMargin.label}`, summary.deeperThanMargin.toLocaleString('en-GB'), `of ${summary.withUnitCost.toLocaleString('en-GB')} with unit cost`],
    [`${FLAGS.noPromoPrice.mark} ${FLAGS.noPromoPrice.label}`, summary.noPromoPrice.toLocaleString('en-GB')],
  ];
  return (
    <section aria-label="Plan summary" className="card grid grid-cols-2 divide-rule sm:grid-cols-3 lg:grid-cols-6" data-testid="plan-summary">
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
