import type { PromoPlanDto } from '@/lib/server/promotions/plans';
import { FLOOR_MODEL_SHORT } from '@/lib/promo/model-choice';
import { formatTarget } from '@/lib/promo/format';
import { PRICE_ENDING_LABELS } from '@/lib/schemas/study.schema';

/** What the plan was built from: enough to reproduce it. */
export function PlanFacts({ plan }: { plan: PromoPlanDto }) {
  const rules = plan.exclusionRules as Record<string, { enabled?: boolean }> | null;
  const on = rules ? Object.entries(rules).filter(([, r]) => r?.enabled).map(([k]) => k) : [];
  const rows: [string, string][] = [
    ['Study', plan.study.name],
    ['Respondents', plan.settings.segment ? `${plan.settings.segment.questionId}: ${plan.settings.segment.answer}` : 'All respondents'],
    ['Fit version', `data version ${plan.fitVersion}`],
    ['Exclusion rules', on.length ? on.join(', ') : 'none'],
    ['Model', `${FLOOR_MODEL_SHORT[plan.settings.model]}${plan.settings.modelChoice === 'preferred' ? ' (study’s preferred)' : ''}`],
    ['Notice rate', formatTarget(plan.settings.target)],
    ['Price ending', PRICE_ENDING_LABELS[plan.settings.ending]],
    ['Price list', `${plan.priceList.name} · ${plan.priceList.currency}`],
    ['Tested base prices', plan.fit.testedBasePrices.join(' · ')],
  ];
  return (
    <section aria-labelledby="facts-h" className="card p-4 text-sm">
      <h2 id="facts-h" className="mb-2 text-base">Built from</h2>
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
        {rows.map(([k, v]) => (
          <div key={k} className="contents"><dt className="text-muted">{k}</dt><dd>{v}</dd></div>
        ))}
      </dl>
    </section>
  );
}
