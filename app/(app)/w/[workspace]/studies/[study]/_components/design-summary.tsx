import type { StudyDetail } from '@/lib/server/studies/studies';
import { estimatedMinutes, LANGUAGE_LABELS, PRICE_ENDING_LABELS, STAIRCASE_RULE_LABELS, TASK_LABELS, trialsPerRespondent } from '@/lib/schemas/study.schema';

const dt = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

/** The design at a glance, in the study's own currency and locale. */
export function DesignSummary({ study }: { study: StudyDetail }) {
  const d = study.design;
  const money = new Intl.NumberFormat(d.locale, { style: 'currency', currency: d.currency });
  const t = trialsPerRespondent(d);
  const rows: [string, React.ReactNode][] = [
    ['Item', `${d.itemName} (${d.category})`],
    ['Task', TASK_LABELS[d.task] + (d.task === 'spot' ? `, shelf of ${d.shelfSize}` : d.task === 'pick' ? `, ${d.viewMs} ms view` : `, ${d.tripMinutes} min away`)],
    ['Base prices', <span key="b" className="num">{d.basePrices.map((b) => money.format(b)).join(' · ')}</span>],
    ['Ladder', <span key="l" className="num">{d.ladder.map((x) => `${Math.round(x * 1000) / 10} %`).join(' · ')}</span>],
    ['Placement', d.adaptive.enabled ? `Adaptive: ${STAIRCASE_RULE_LABELS[d.adaptive.rule]}` : `${d.repetitions} repetitions per cell`],
    ['Per respondent', <span key="t" className="num">{t.total} trials · about {estimatedMinutes(d)} min</span>],
    ['Catch trials', <span key="c" className="num">{Math.round(d.catchShare * 100)} %</span>],
    ['Respondents see', `${LANGUAGE_LABELS[d.language]}, prices as ${d.locale}`],
    ['Segment questions', d.segmentQuestions.length ? d.segmentQuestions.map((q) => q.text).join('; ') : 'None'],
    ['Attention check', d.attentionCheck.enabled ? 'Yes' : 'No'],
    ['Price ending', PRICE_ENDING_LABELS[d.priceEnding]],
    ['Redirect', d.redirectUrl || 'Thank-you page'],
    ['Created', dt.format(new Date(study.createdAt))],
    ...(study.launchedAt ? ([['Launched', dt.format(new Date(study.launchedAt))]] as [string, string][]) : []),
    ...(study.closedAt ? ([['Closed', dt.format(new Date(study.closedAt))]] as [string, string][]) : []),
  ];
  return (
    <section className="card p-4 text-sm" aria-label="Design">
      <h2 className="mb-2 text-lg">Design</h2>
      <dl className="space-y-1">
        {rows.map(([k, v]) => (
          <div key={k} className="grid grid-cols-[7.5rem_1fr] gap-2 border-b border-rule pb-1 last:border-0">
            <dt className="text-muted">{k}</dt>
            <dd className="break-words">{v}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
