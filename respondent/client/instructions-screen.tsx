'use client';
import { fill, type Messages } from '@/respondent/messages/format';
import type { FlowStudy } from '@/respondent/shared/types';
import { KeysNote, primaryButton } from './price-tag';
import { TaskPicture } from './task-pictures';

/** What each task asks, in steps a shopper reads in a few seconds. */
function taskSteps(m: Messages, study: FlowStudy): string[] {
  const seconds = (study.viewMs / 1000).toLocaleString(study.locale, { maximumFractionDigits: 1 });
  return m.instructions[study.task].map((s) => fill(s, { seconds, minutes: study.tripMinutes }));
}

/** One screen per task before the practice: what will happen, with a small picture of it. */
export function InstructionsScreen({ m, study, practice, questions, onStart }: { m: Messages; study: FlowStudy; practice: number; questions: number; onStart: () => void }) {
  const i = m.instructions;
  return (
    <div className="flex flex-col gap-5" data-testid="instructions" data-task={study.task}>
      <p className="text-base text-muted">{i.heading}</p>
      <h1 className="text-2xl">{i.title[study.task]}</h1>
      <TaskPicture m={m} study={study} />
      <ol className="flex list-decimal flex-col gap-2 pl-6 text-lg">
        {taskSteps(m, study).map((s) => <li key={s}>{s}</li>)}
      </ol>
      <p className="text-lg">
        {practice > 0 ? `${practice === 1 ? i.practiceOne : fill(i.practiceMany, { n: practice })} ` : ''}
        {questions === 1 ? i.questionsOne : fill(i.questionsMany, { n: questions })}
      </p>
      <KeysNote>{i.keys[study.task]}</KeysNote>
      <button type="button" className={primaryButton} onClick={onStart}>{practice > 0 ? i.startPractice : i.start}</button>
    </div>
  );
}
