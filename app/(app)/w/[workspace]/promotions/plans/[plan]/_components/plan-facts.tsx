import type { PromoPlanDto } from '@/lib/server/promotions/plans';
import { FLOOR_MODEL_SHORT } from '@/lib/promo/model-choice';
import { formatTarget } from '@/lib/promo/format';
import { PRICE_ENDING_LABELS } from '@/lib/schemas/study.schema';
import { EXCLUSION_RULE_LABELS, type ExclusionRuleId } from '@/lib/schemas/exclusions.schema';
import { describeBasis, describeTolerance } from '@/lib/promo/plan-export';
import { describeFitSource } from '@/lib/promo/fit-source';

/** What the plan was built from: enough to reproduce it. */
export function PlanFacts({ plan }: { plan: PromoPlanDto }) {
  const rules = plan.exclusionRules as Record<string, { enabled?: boolean }> | null;
  const on = rules ? Object.entries(rules).filter(([, r]) => r?.enabled).map(([k]) => EXCLUSION_RULE_LABELS[k as ExclusionRuleId] ?? k) : [];
  const basis = plan.settings.basis ?? 'point';
  const rows: [string, string][] = [
    ['Study', plan.study.name],
    ['Fit basis', plan.fit.source ? describeFitSource(plan.fit.source) : 'The study’s own fit'],
    ['Respondents', plan.settings.segment ? `${plan.settings.segment.questionId}: ${plan.settings.segment.answer}` : 'All respondents'],
    ['Fit version', `data version ${plan.fitVersion}`],
    ['Exclusion rules', on.length ? on.join('; ') : 'none'],
    ['Model', `${FLOOR_MODEL_SHORT[plan.settings.model]}${plan.settings.modelChoice === 'preferred' ? ' (study’s preferred)' : ''}`],
    ['Floor basis', describeBasis(basis, plan.settings.share ?? null)],
    ['Notice rate', basis === 'share' ? 'Not used: each shopper at their own threshold' : formatTarget(plan.settings.target)],
    ['Price ending', PRICE_ENDING_LABELS[plan.settings.ending]],
    ['Ending tolerance', describeTolerance(plan.settings.tolerance ?? null)],
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
