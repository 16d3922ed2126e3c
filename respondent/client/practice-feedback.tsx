'use client';
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

function feedbackWords(study: FlowStudy, trial: PublicTrial, answer: number): { title: string; text: string } {
  const f = (v: number) => formatPrice(v, study.currency, study.locale);
  const now = f(trial.price), usual = f(trial.base);
  const verdict = practiceVerdict(study, trial, answer);
  if (study.task === 'trip') {
    return {
      title: 'Thanks, noted',
      text: `There is no right or wrong answer here. You chose to ${answer === 1 ? 'go to the other store' : 'buy it here'}: ${now} there, ${usual} here, ${study.tripMinutes} minutes away. Answer the way you would on a real shopping trip.`,
    };
  }
  if (study.task === 'pick') {
    const side = trial.side === 'right' ? 'right' : 'left';
    return verdict
      ? { title: 'Well spotted', text: `The ${side} tag was lower: ${now} against ${usual}.` }
      : { title: 'Not this time, and that is fine', text: `The lower price, ${now}, was on the ${side} tag; the other showed ${usual}. The tags are shown only briefly. Go with your first impression.` };
  }
  if (trial.price < trial.base) {
    return verdict
      ? { title: 'Well spotted', text: `This was lower than usual: ${now} instead of ${usual}.` }
      : { title: 'Not this time, and that is fine', text: `This one was lower than usual: ${now} instead of the ${usual} on the shelf. Compare with the price you remember.` };
  }
  return verdict
    ? { title: 'Right', text: `This was the usual price, ${usual}.` }
    : { title: 'Not this time, and that is fine', text: `This was the usual price, ${usual}.` };
}

const LAST_WORDS: Record<FlowStudy['task'], string> = {
  spot: 'Some differences will be small, and some prices will be the usual one: give your best guess.',
  pick: 'Some differences will be small: go with your first impression.',
  trip: 'There are no right answers: choose as you would when shopping.',
};

/** After a practice answer: said kindly, never as a score; the last one leads into the real questions. */
export function PracticeFeedback({ study, trial, answer, last, onNext }: { study: FlowStudy; trial: PublicTrial; answer: number; last: boolean; onNext: () => void }) {
  const w = feedbackWords(study, trial, answer);
  const verdict = practiceVerdict(study, trial, answer);
  return (
    <div className="flex flex-col gap-5" data-testid="practice-feedback" data-verdict={verdict === null ? 'choice' : verdict ? 'right' : 'wrong'}>
      <div className={`flex flex-col gap-2 rounded-sm border-l-4 bg-card px-4 py-3 ${verdict === false ? 'border-amber' : 'border-moss'}`}>
        <h1 className="text-xl">{w.title}</h1>
        <p className="text-lg">{w.text}</p>
      </div>
      {last ? (
        <p className="text-lg">
          That was the last practice round. Now the real questions begin; from here on there is no feedback.
          {' '}{LAST_WORDS[study.task]}
        </p>
      ) : null}
      <button type="button" className={primaryButton} onClick={onNext}>{last ? 'Start the real questions' : 'Next practice round'}</button>
    </div>
  );
}
