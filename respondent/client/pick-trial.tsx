'use client';
import { useEffect, useRef, useState } from 'react';
import type { Messages } from '@/respondent/messages/format';
import type { FlowStudy, PublicTrial, Side } from '@/respondent/shared/types';
import { KeyHint, KeysNote, PriceTag, bigButton } from './price-tag';
import { useAnswerKeys } from './screen-hooks';

const READY_MS = 700;
const now = () => performance.now();

/**
 * Pick the lower price: two tags for a brief view, then hidden, then the choice. Prices are
 * never left side by side in full view, so the choice rests on a glance, not arithmetic. The
 * answer buttons take the tags' places, so the thumb goes where the eye was.
 */
export function PickTrial({ m, study, trial, onAnswer, initialPhase = 'ready' }: {
  m: Messages; study: FlowStudy; trial: PublicTrial; onAnswer: (answer: number, ms: number) => void;
  /** Where the screen starts: always 'ready' in the flow; the language test renders each phase (tests/unit/respondent-messages.test.ts). */
  initialPhase?: 'ready' | 'view' | 'choose';
}) {
  const [phase, setPhase] = useState<'ready' | 'view' | 'choose'>(initialPhase);
  const hiddenAt = useRef(0);
  const answered = useRef(false);
  useEffect(() => {
    const a = setTimeout(() => setPhase('view'), READY_MS);
    const b = setTimeout(() => { hiddenAt.current = performance.now(); setPhase('choose'); }, READY_MS + study.viewMs);
    return () => { clearTimeout(a); clearTimeout(b); };
  }, [study.viewMs]);

  const lower = trial.side ?? 'left';
  const priceOn = (s: Side) => (s === lower ? trial.price : trial.base);
  const choose = (s: Side) => {
    if (answered.current) return;
    answered.current = true;
    onAnswer(s === lower ? 1 : 0, Math.round(now() - hiddenAt.current));
  };
  useAnswerKeys({ ArrowLeft: () => choose('left'), ArrowRight: () => choose('right'), 1: () => choose('left'), 2: () => choose('right') }, phase === 'choose');

  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-center text-2xl">{trial.label}</h1>
      <p className="text-center text-lg" aria-live="polite">
        {phase === 'choose' ? m.trial.pickChoose : phase === 'ready' ? m.trial.pickReady : m.trial.pickLook}
      </p>
      <div className="grid grid-cols-2 gap-3" data-phase={phase}>
        {(['left', 'right'] as const).map((s) =>
          phase === 'choose' ? (
            <button key={s} type="button" onClick={() => choose(s)} aria-keyshortcuts={s === 'left' ? 'ArrowLeft' : 'ArrowRight'}
              className={`${bigButton} min-h-24 flex-col gap-1`}>
              <span className="text-xl">{m.trial[s]}</span>
              <KeyHint k={s === 'left' ? '←' : '→'} />
            </button>
          ) : (
            <PriceTag key={s} study={study} price={priceOn(s)} hidden={phase === 'ready'} size="md" caption={m.trial[s]} />
          ),
        )}
      </div>
      {phase === 'choose' ? <KeysNote>{m.trial.pickKeys}</KeysNote> : null}
    </div>
  );
}
