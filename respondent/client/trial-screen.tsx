'use client';
import { useEffect, useRef } from 'react';
import { fill, fillParts, type Messages } from '@/respondent/messages/format';
import { formatPrice } from '@/respondent/shared/price';
import type { FlowStudy, PublicTrial } from '@/respondent/shared/types';
import { PickTrial } from './pick-trial';
import { KeyHint, KeysNote, PriceTag, bigButton } from './price-tag';
import { useAnswerKeys } from './screen-hooks';

type OnAnswer = (answer: number, ms: number) => void;

/** Time since the screen appeared, and a guard so a double tap (or tap + key) answers once. */
function useAnswer(onAnswer: OnAnswer) {
  const t0 = useRef(0);
  const done = useRef(false);
  useEffect(() => { t0.current = performance.now(); }, []);
  return (answer: number) => {
    if (done.current) return;
    done.current = true;
    onAnswer(answer, Math.round(performance.now() - t0.current));
  };
}

/** Two answers, yes first: buttons with their keys (1, 2) for desktop respondents. */
function TwoAnswers({ m, yes, no, answer }: { m: Messages; yes: string; no: string; answer: (a: number) => void }) {
  useAnswerKeys({ 1: () => answer(1), 2: () => answer(0) });
  return (
    <>
      <div className="flex w-full flex-col gap-3">
        <button type="button" className={bigButton} aria-keyshortcuts="1" onClick={() => answer(1)}><KeyHint k="1" />{yes}</button>
        <button type="button" className={bigButton} aria-keyshortcuts="2" onClick={() => answer(0)}><KeyHint k="2" />{no}</button>
      </div>
      <KeysNote>{m.trial.keysTwo}</KeysNote>
    </>
  );
}

function SpotTrial({ m, study, trial, onAnswer }: { m: Messages; study: FlowStudy; trial: PublicTrial; onAnswer: OnAnswer }) {
  const answer = useAnswer(onAnswer);
  return (
    <div className="flex flex-col items-center gap-5">
      <h1 className="text-center text-2xl">{trial.label}</h1>
      <PriceTag study={study} price={trial.price} />
      <p className="text-center text-lg">{m.trial.spotQuestion}</p>
      <TwoAnswers m={m} yes={m.trial.spotYes} no={m.trial.spotNo} answer={answer} />
    </div>
  );
}

function TripTrial({ m, study, trial, onAnswer }: { m: Messages; study: FlowStudy; trial: PublicTrial; onAnswer: OnAnswer }) {
  const answer = useAnswer(onAnswer);
  const there = formatPrice(trial.price, study.currency, study.locale);
  return (
    <div className="flex flex-col items-center gap-4">
      <h1 className="text-center text-2xl">{trial.label}</h1>
      <PriceTag study={study} price={trial.base} caption={m.trial.tripHere} />
      <p className="text-center text-lg">
        {fillParts(m.trial.tripOffer, { minutes: study.tripMinutes, price: <span key="price" className="num font-semibold">{there}</span> })}
        {' '}{m.trial.tripQuestion}
      </p>
      <TwoAnswers m={m} yes={m.trial.tripYes} no={m.trial.tripNo} answer={answer} />
    </div>
  );
}

function AttentionTrial({ m, trial, onAnswer }: { m: Messages; trial: PublicTrial; onAnswer: OnAnswer }) {
  const answer = useAnswer(onAnswer);
  const a = trial.attention!;
  useAnswerKeys(Object.fromEntries(a.options.map((_, i) => [String(i + 1), () => answer(i)])));
  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-2xl">{a.question}</h1>
      <div className="flex flex-col gap-3">
        {a.options.map((o, i) => (
          <button key={o} type="button" className={bigButton} aria-keyshortcuts={String(i + 1)} onClick={() => answer(i)}><KeyHint k={String(i + 1)} />{o}</button>
        ))}
      </div>
      <KeysNote>{fill(m.trial.keysRange, { n: a.options.length })}</KeysNote>
    </div>
  );
}

/** One trial; keyed by idx in the flow so every trial starts with fresh timers. */
export function TrialScreen({ m, study, trial, onAnswer }: { m: Messages; study: FlowStudy; trial: PublicTrial; onAnswer: OnAnswer }) {
  const body =
    trial.kind === 'attention' ? <AttentionTrial m={m} trial={trial} onAnswer={onAnswer} />
      : study.task === 'pick' ? <PickTrial m={m} study={study} trial={trial} onAnswer={onAnswer} />
        : study.task === 'trip' ? <TripTrial m={m} study={study} trial={trial} onAnswer={onAnswer} />
          : <SpotTrial m={m} study={study} trial={trial} onAnswer={onAnswer} />;
  return (
    <div className="flex flex-col gap-3" data-testid="trial" data-kind={trial.kind}>
      {trial.kind === 'practice' ? <p className="pill self-start text-base text-muted">{m.trial.practiceBadge}</p> : null}
      {study.pictureUrl && trial.kind !== 'attention' ? (
        // eslint-disable-next-line @next/next/no-img-element -- a small stored picture; next/image would add script
        <img src={study.pictureUrl} alt="" className="mx-auto max-h-20 w-auto" />
      ) : null}
      {body}
    </div>
  );
}
