'use client';
import { useWatch } from 'react-hook-form';
import { estimatedMinutes, trialsPerRespondent, type StudyDesign } from '@/lib/schemas/study.schema';
import type { BuilderForm } from './form-bits';

const n = (v: unknown, fallback = 0) => (Number.isFinite(Number(v)) && v !== '' ? Number(v) : fallback);
const positives = (xs: unknown) => (Array.isArray(xs) ? xs.map(Number).filter((x) => Number.isFinite(x) && x > 0) : []);

/** Counts from whatever the form holds now, half-typed values included (invalid entries are skipped). */
export function summarise(v: Record<string, unknown>) {
  const adaptive = (v.adaptive ?? {}) as Record<string, unknown>;
  const d = {
    task: v.task,
    basePrices: [...new Set(positives(v.basePrices))],
    ladder: [...new Set(positives(v.ladder).filter((x) => x < 1))],
    repetitions: Math.max(0, Math.round(n(v.repetitions))),
    catchShare: Math.min(0.5, Math.max(0, n(v.catchShare))),
    practiceTrials: Math.max(0, Math.round(n(v.practiceTrials))),
    adaptive: { enabled: !!adaptive.enabled, trialsPerBase: Math.max(0, Math.round(n(adaptive.trialsPerBase))) },
    attentionCheck: { enabled: !!(v.attentionCheck as { enabled?: boolean } | undefined)?.enabled },
    viewMs: n(v.viewMs, 1200),
    shelfSize: n(v.shelfSize, 6),
  } as unknown as StudyDesign;
  return { trials: trialsPerRespondent(d), minutes: estimatedMinutes(d), bases: d.basePrices.length, rungs: d.ladder.length };
}

export function BuilderSummary({ form }: { form: BuilderForm }) {
  const values = useWatch({ control: form.control }) as Record<string, unknown>;
  const s = summarise(values);
  const adaptive = !!(values.adaptive as { enabled?: boolean } | undefined)?.enabled;
  return (
    <aside className="card space-y-2 p-4 text-sm" aria-live="polite" aria-label="Per respondent">
      <h2 className="text-lg">Per respondent</h2>
      <dl className="grid grid-cols-[1fr_auto] gap-x-4 gap-y-1">
        <dt>Trials in all</dt><dd className="num text-right text-lg font-semibold" data-testid="trials-per-respondent">{s.trials.total}</dd>
        <dt className="text-muted">{adaptive ? 'Staircase trials' : `Test trials (${s.bases} × ${s.rungs} × reps)`}</dt><dd className="num text-right">{s.trials.test}</dd>
        <dt className="text-muted">Catch trials</dt><dd className="num text-right">{s.trials.catch}</dd>
        <dt className="text-muted">Practice</dt><dd className="num text-right">{s.trials.practice}</dd>
        <dt className="text-muted">Attention check</dt><dd className="num text-right">{s.trials.attention}</dd>
        <dt className="border-t border-rule pt-1">Estimated minutes</dt><dd className="num border-t border-rule pt-1 text-right text-lg font-semibold" data-testid="estimated-minutes">{s.minutes}</dd>
      </dl>
      <p className="hint">Minutes are an estimate: the pace of a measured phone respondent for “pick the lower price” (about 100 s for 36 trials), working estimates for the other tasks, plus instructions and practice. Keep phone studies short.</p>
    </aside>
  );
}
