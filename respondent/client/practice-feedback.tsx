'use client';
import { fill, type Messages } from '@/respondent/messages/format';
import { formatPrice } from '@/respondent/shared/price';
import type { FlowStudy, PublicTrial } from '@/respondent/shared/types';
import { primaryButton } from './price-tag';

/**
 * Whether a practice answer was right: spot — a lower price is "lower"; pick — answer 1 is the
 * lower tag; trip is a choice with no right answer (null). Practice screens always carry a
 * discount, so the right answer is known in the browser; what is recorded is only the answer,
 * stored as practice and never analysed.
 */
export function practiceVerdict(study: FlowStudy, trial: PublicTrial, answer: number): boolean | null {
  if (study.task === 'trip') return null;
  if (study.task === 'pick') return answer === 1;
  return (trial.price < trial.base) === (answer === 1);
}

function feedbackWords(m: Messages, study: FlowStudy, trial: PublicTrial, answer: number): { title: string; text: string } {
  const f = (v: number) => formatPrice(v, study.currency, study.locale);
  const vars = { now: f(trial.price), usual: f(trial.base), minutes: study.tripMinutes };
  const w = m.feedback;
  const verdict = practiceVerdict(study, trial, answer);
  if (study.task === 'trip') return { title: w.tripTitle, text: fill(answer === 1 ? w.tripGo : w.tripStay, vars) };
  if (study.task === 'pick') {
    const right = trial.side === 'right';
    return verdict
      ? { title: w.wellSpotted, text: fill(right ? w.pickRightRight : w.pickRightLeft, vars) }
      : { title: w.notThisTime, text: fill(right ? w.pickWrongRight : w.pickWrongLeft, vars) };
  }
  if (trial.price < trial.base) {
    return verdict
      ? { title: w.wellSpotted, text: fill(w.spotLowerRight, vars) }
      : { title: w.notThisTime, text: fill(w.spotLowerWrong, vars) };
  }
  return { title: verdict ? w.right : w.notThisTime, text: fill(w.spotSame, vars) };
}

/** After a practice answer: said kindly, never as a score; the last one leads into the real questions. */
export function PracticeFeedback({ m, study, trial, answer, last, onNext }: { m: Messages; study: FlowStudy; trial: PublicTrial; answer: number; last: boolean; onNext: () => void }) {
  const w = feedbackWords(m, study, trial, answer);
  const verdict = practiceVerdict(study, trial, answer);
  return (
    <div className="flex flex-col gap-5" data-testid="practice-feedback" data-verdict={verdict === null ? 'choice' : verdict ? 'right' : 'wrong'}>
      <div className={`flex flex-col gap-2 rounded-sm border-l-4 bg-card px-4 py-3 ${verdict === false ? 'border-amber' : 'border-moss'}`}>
        <h1 className="text-xl">{w.title}</h1>
        <p className="text-lg">{w.text}</p>
      </div>
      {last ? (
        <p className="text-lg">
          {m.feedback.last}{' '}{m.feedback.lastWords[study.task]}
        </p>
      ) : null}
      <button type="button" className={primaryButton} onClick={onNext}>{last ? m.feedback.startReal : m.feedback.nextPractice}</button>
    </div>
  );
}
