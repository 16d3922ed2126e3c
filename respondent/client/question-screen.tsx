import type { SegmentQuestion } from '@/lib/schemas/study.schema';
import { fill, type Messages } from '@/respondent/messages/format';
import { bigButton } from './price-tag';

/** One segment question per screen; tapping an answer moves on. */
export function QuestionScreen({ m, question, n, of, onAnswer }: { m: Messages; question: SegmentQuestion; n: number; of: number; onAnswer: (option: string) => void }) {
  return (
    <div className="flex flex-col gap-5">
      <p className="text-base text-muted">{fill(m.question.progress, { n, of })}</p>
      <h1 className="text-2xl">{question.text}</h1>
      <div className="flex flex-col gap-3" role="group" aria-label={question.text}>
        {question.options.map((o) => (
          <button key={o} type="button" className={bigButton} onClick={() => onAnswer(o)}>{o}</button>
        ))}
      </div>
    </div>
  );
}
