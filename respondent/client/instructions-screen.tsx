'use client';
import type { FlowStudy } from '@/respondent/shared/types';
import { KeysNote, primaryButton } from './price-tag';
import { TaskPicture } from './task-pictures';

/** What each task asks, in steps a shopper reads in a few seconds. */
function taskSteps(study: FlowStudy): string[] {
  const seconds = (study.viewMs / 1000).toLocaleString(study.locale, { maximumFractionDigits: 1 });
  if (study.task === 'spot') {
    return [
      'First you see a short shelf of items with their usual prices. Take a moment to remember them.',
      'Then the items come up one at a time with a price. Say whether it is lower than usual, or the same.',
      'The shelf is shown again now and then. There is no time limit.',
    ];
  }
  if (study.task === 'pick') {
    return [
      `Two price tags for the same item appear for about ${seconds} seconds, then they are covered.`,
      'Choose the side that showed the lower price. If you are not sure, go with your first impression.',
    ];
  }
  return [
    'You see an item at its price here, in this store.',
    `Another store, ${study.tripMinutes} minutes away, sells it for less. Would you go there for it, or buy it here?`,
    'There are no right answers: choose as you would on a real shopping trip.',
  ];
}

const KEYS: Record<FlowStudy['task'], string> = {
  spot: 'On a keyboard: 1 for “lower than usual”, 2 for “the same”; Enter for buttons like the one below.',
  pick: 'On a keyboard: ← for the left tag, → for the right; Enter for buttons like the one below.',
  trip: 'On a keyboard: 1 to go to the other store, 2 to buy it here; Enter for buttons like the one below.',
};

const TITLES: Record<FlowStudy['task'], string> = {
  spot: 'Spot the saving',
  pick: 'Pick the lower price',
  trip: 'Worth the trip?',
};

/** One screen per task before the practice: what will happen, with a small picture of it. */
export function InstructionsScreen({ study, practice, questions, onStart }: { study: FlowStudy; practice: number; questions: number; onStart: () => void }) {
  return (
    <div className="flex flex-col gap-5" data-testid="instructions" data-task={study.task}>
      <p className="text-base text-muted">How it works</p>
      <h1 className="text-2xl">{TITLES[study.task]}</h1>
      <TaskPicture study={study} />
      <ol className="flex list-decimal flex-col gap-2 pl-6 text-lg">
        {taskSteps(study).map((s) => <li key={s}>{s}</li>)}
      </ol>
      <p className="text-lg">
        {practice > 0 ? `First ${practice === 1 ? 'one practice round shows' : `${practice} practice rounds show`} you how you did; ${practice === 1 ? 'it does' : 'they do'} not count. ` : ''}
        Then {questions} {questions === 1 ? 'question' : 'questions'}.
      </p>
      <KeysNote>{KEYS[study.task]}</KeysNote>
      <button type="button" className={primaryButton} onClick={onStart}>{practice > 0 ? 'Start the practice' : 'Start'}</button>
    </div>
  );
}
