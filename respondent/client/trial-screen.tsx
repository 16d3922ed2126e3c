'use client';
import { useEffect, useRef } from 'react';
import { formatPrice } from '@/respondent/shared/price';
import type { FlowStudy, PublicTrial } from '@/respondent/shared/types';
import { PickTrial } from './pick-trial';
import { PriceTag, bigButton } from './price-tag';

type OnAnswer = (answer: number, ms: number) => void;

function useTimer() {
  const t0 = useRef(0);
  useEffect(() => { t0.current = performance.now(); }, []);
  return () => Math.round(performance.now() - t0.current);
}

function SpotTrial({ study, trial, onAnswer }: { study: FlowStudy; trial: PublicTrial; onAnswer: OnAnswer }) {
  const elapsed = useTimer();
  return (
    <div className="flex flex-col items-center gap-6">
      <h1 className="text-center text-2xl">{trial.label}</h1>
      <PriceTag study={study} price={trial.price} />
      <p className="text-center text-lg">Compared with the usual price you saw on the shelf, is this price lower, or the same?</p>
      <div className="flex w-full flex-col gap-3">
        <button type="button" className={bigButton} onClick={() => onAnswer(1, elapsed())}>Lower than usual</button>
        <button type="button" className={bigButton} onClick={() => onAnswer(0, elapsed())}>The same</button>
      </div>
    </div>
  );
}

function TripTrial({ study, trial, onAnswer }: { study: FlowStudy; trial: PublicTrial; onAnswer: OnAnswer }) {
  const elapsed = useTimer();
  const there = formatPrice(trial.price, study.currency, study.locale);
  return (
    <div className="flex flex-col items-center gap-5">
      <h1 className="text-center text-2xl">{trial.label}</h1>
      <PriceTag study={study} price={trial.base} caption="here, in this store" />
      <p className="text-center text-lg">
        Another store {study.tripMinutes} minutes away sells the same item for <span className="num font-semibold">{there}</span>.
      </p>
      <p className="text-center text-lg">Would you go there for it, or buy it here?</p>
      <div className="flex w-full flex-col gap-3">
        <button type="button" className={bigButton} onClick={() => onAnswer(1, elapsed())}>Go to the other store</button>
        <button type="button" className={bigButton} onClick={() => onAnswer(0, elapsed())}>Buy it here</button>
      </div>
    </div>
  );
}

function AttentionTrial({ trial, onAnswer }: { trial: PublicTrial; onAnswer: OnAnswer }) {
  const elapsed = useTimer();
  const a = trial.attention!;
  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-2xl">{a.question}</h1>
      <div className="flex flex-col gap-3">
        {a.options.map((o, i) => (
          <button key={o} type="button" className={bigButton} onClick={() => onAnswer(i, elapsed())}>{o}</button>
        ))}
      </div>
    </div>
  );
}

/** One trial; keyed by idx in the flow so every trial starts with fresh timers. */
export function TrialScreen({ study, trial, onAnswer }: { study: FlowStudy; trial: PublicTrial; onAnswer: OnAnswer }) {
  const body =
    trial.kind === 'attention' ? <AttentionTrial trial={trial} onAnswer={onAnswer} />
      : study.task === 'pick' ? <PickTrial study={study} trial={trial} onAnswer={onAnswer} />
        : study.task === 'trip' ? <TripTrial study={study} trial={trial} onAnswer={onAnswer} />
          : <SpotTrial study={study} trial={trial} onAnswer={onAnswer} />;
  return (
    <div className="flex flex-col gap-4" data-testid="trial" data-kind={trial.kind}>
      {trial.kind === 'practice' ? <p className="pill self-start text-muted">Practice round</p> : null}
      {study.pictureUrl && trial.kind !== 'attention' ? (
        // eslint-disable-next-line @next/next/no-img-element -- a small stored picture; next/image would add script
        <img src={study.pictureUrl} alt="" className="mx-auto max-h-32 w-auto" />
      ) : null}
      {body}
    </div>
  );
}
