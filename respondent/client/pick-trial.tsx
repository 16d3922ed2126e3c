'use client';
import { useEffect, useRef, useState } from 'react';
import type { FlowStudy, PublicTrial, Side } from '@/respondent/shared/types';
import { PriceTag } from './price-tag';

const READY_MS = 700;
const now = () => performance.now();

/**
 * Pick the lower price: two tags for a brief view, then hidden, then the choice. Prices are
 * never left side by side in full view, so the choice rests on a glance, not arithmetic.
 */
export function PickTrial({ study, trial, onAnswer }: { study: FlowStudy; trial: PublicTrial; onAnswer: (answer: number, ms: number) => void }) {
  const [phase, setPhase] = useState<'ready' | 'view' | 'choose'>('ready');
  const hiddenAt = useRef(0);
  useEffect(() => {
    const a = setTimeout(() => setPhase('view'), READY_MS);
    const b = setTimeout(() => { hiddenAt.current = performance.now(); setPhase('choose'); }, READY_MS + study.viewMs);
    return () => { clearTimeout(a); clearTimeout(b); };
  }, [study.viewMs]);

  const lower = trial.side ?? 'left';
  const priceOn = (s: Side) => (s === lower ? trial.price : trial.base);
  const choose = (s: Side) => onAnswer(s === lower ? 1 : 0, Math.round(now() - hiddenAt.current));

  return (
    <div className="flex flex-col gap-6">
      <h1 className="text-center text-2xl">{trial.label}</h1>
      <p className="text-center text-lg">{phase === 'choose' ? 'Which tag showed the lower price?' : phase === 'ready' ? 'Look at the two tags…' : 'Look closely'}</p>
      <div className="grid grid-cols-2 gap-3" data-phase={phase}>
        {(['left', 'right'] as const).map((s) =>
          phase === 'choose' ? (
            <button key={s} type="button" onClick={() => choose(s)}
              className="flex min-h-28 items-center justify-center rounded-sm border-2 border-dashed border-teal bg-card text-xl font-semibold text-teal active:bg-teal-light">
              {s === 'left' ? 'Left' : 'Right'}
            </button>
          ) : (
            <PriceTag key={s} study={study} price={priceOn(s)} hidden={phase === 'ready'} size="md" caption={s === 'left' ? 'Left' : 'Right'} />
          ),
        )}
      </div>
    </div>
  );
}
