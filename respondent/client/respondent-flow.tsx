'use client';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { SegmentQuestion } from '@/lib/schemas/study.schema';
import type { FlowState, FlowStudy, PublicTrial } from '@/respondent/shared/types';
import { ConsentScreen } from './consent-screen';
import { newClientId, type FlowDriver } from './driver';
import { QuestionScreen } from './question-screen';
import { ShelfScreen } from './shelf-screen';
import { TrialScreen } from './trial-screen';
import { useAnswerQueue, withRetry } from './use-answer-queue';
import { FlowColumn, Progress, Reconnecting, Stopped, Thanks, Waiting } from './status-screens';

type Step = { s: 'consent' } | { s: 'question'; i: number } | { s: 'shelf'; again: boolean } | { s: 'trial' } | { s: 'wait' } | { s: 'thanks' } | { s: 'stopped'; code: string; message: string };

export interface FlowProps {
  driver: FlowDriver;
  study: FlowStudy;
  consentText: string;
  retentionDays: number;
  questions: SegmentQuestion[];
  /** Set when resuming: the respondent has already agreed. */
  initial: FlowState | null;
  formAction?: string;
  pid?: string | null;
}

function firstStep(initial: FlowState | null, questions: SegmentQuestion[]): Step {
  if (!initial) return { s: 'consent' };
  if (initial.phase === 'completed') return { s: 'thanks' };
  if (initial.phase === 'questions') return questions.length ? { s: 'question', i: 0 } : { s: 'wait' };
  if (initial.phase === 'done') return { s: 'wait' };
  return initial.study.task === 'spot' ? { s: 'shelf', again: initial.answered > 0 } : { s: 'trial' };
}

/** consent → segment questions → (shelf) → practice and trials → thank you; a small state machine. */
export function RespondentFlow(p: FlowProps) {
  const [step, setStep] = useState<Step>(() => firstStep(p.initial, p.questions));
  const [flow, setFlow] = useState<FlowState | null>(p.initial);
  const [upcoming, setUpcomingState] = useState<PublicTrial[]>(p.initial?.upcoming ?? []);
  // Mirrors `upcoming` for the queue's callbacks, which run outside React's render.
  const upRef = useRef(upcoming);
  const setUpcoming = (list: PublicTrial[]) => { upRef.current = list; setUpcomingState(list); };
  const [answered, setAnswered] = useState(p.initial?.answered ?? 0);
  const [answers, setAnswers] = useState<Record<string, string>>({});
  const [starting, setStarting] = useState(false);

  const stop = useCallback((code: string, message: string) => setStep({ s: 'stopped', code, message }), []);

  // Callers are already on the waiting step when they finish.
  const finish = useCallback(async (retrying: (on: boolean) => void) => {
    const r = await withRetry(() => p.driver.complete(), retrying);
    if (!r.ok) return stop(r.code, r.message);
    if (r.data.redirectUrl) window.location.assign(r.data.redirectUrl);
    else setStep({ s: 'thanks' });
  }, [p.driver, stop]);

  const q = useAnswerQueue(p.driver, {
    onNext: (next) => {
      setUpcoming(next ? [next] : []);
      if (!next) setStep({ s: 'wait' });
      if (!next) void finish(q.setReconnecting);
      else setStep(next.refresh && flow?.study.task === 'spot' ? { s: 'shelf', again: true } : { s: 'trial' });
    },
    onDrained: () => {
      if (!upRef.current.length && !flow?.adaptive) { setStep({ s: 'wait' }); void finish(q.setReconnecting); }
    },
    onStopped: stop,
  });

  useEffect(() => {
    // Resumed after the last answer but before completing: complete now.
    if (p.initial?.phase !== 'done') return;
    const t = setTimeout(() => void finish(q.setReconnecting), 0);
    return () => clearTimeout(t);
    // eslint-disable-next-line react-hooks/exhaustive-deps -- once, on mount
  }, []);

  async function begin(segmentAnswers: Record<string, string>) {
    if (starting) return;
    setStarting(true);
    setStep({ s: 'wait' });
    const r = await withRetry(() => p.driver.start(segmentAnswers), q.setReconnecting);
    setStarting(false);
    if (!r.ok) return stop(r.code, r.message);
    setFlow(r.data);
    setUpcoming(r.data.upcoming);
    setAnswered(r.data.answered);
    const next = firstStep(r.data, []);
    if (next.s === 'wait' && r.data.phase === 'done') void finish(q.setReconnecting);
    else setStep(next);
  }

  function answerQuestion(option: string, i: number) {
    const id = p.questions[i].id;
    const all = { ...answers, [id]: option };
    setAnswers(all);
    if (i + 1 < p.questions.length) setStep({ s: 'question', i: i + 1 });
    else void begin(all);
  }

  function answerTrial(trial: PublicTrial, answer: number, ms: number) {
    q.push({ clientId: newClientId(), idx: trial.idx, answer, responseMs: Math.max(0, ms) });
    setAnswered((n) => n + 1);
    const rest = upcoming.slice(1);
    setUpcoming(rest);
    if (rest.length) setStep(rest[0].refresh && flow?.study.task === 'spot' ? { s: 'shelf', again: true } : { s: 'trial' });
    // Adaptive plans learn the next trial from the answer's response; fixed ones finish once sent.
    else setStep({ s: 'wait' });
  }

  const study = flow?.study ?? p.study;
  const current = upcoming[0];
  let body: React.ReactNode;
  if (step.s === 'consent') {
    body = <ConsentScreen consentText={p.consentText} retentionDays={p.retentionDays} action={p.formAction} pid={p.pid}
      onAgree={() => (p.questions.length ? setStep({ s: 'question', i: 0 }) : void begin({}))} />;
  } else if (step.s === 'question') {
    body = <QuestionScreen key={step.i} question={p.questions[step.i]} n={step.i + 1} of={p.questions.length} onAnswer={(o) => answerQuestion(o, step.i)} />;
  } else if (step.s === 'shelf' && flow) {
    body = <ShelfScreen study={study} shelf={flow.shelf} again={step.again} onDone={() => setStep(upcoming.length ? { s: 'trial' } : { s: 'wait' })} />;
  } else if (step.s === 'trial' && current) {
    body = <TrialScreen key={current.idx} study={study} trial={current} onAnswer={(a, ms) => answerTrial(current, a, ms)} />;
  } else if (step.s === 'thanks') {
    body = <Thanks />;
  } else if (step.s === 'stopped') {
    body = <Stopped code={step.code} message={step.message} />;
  } else {
    body = <Waiting />;
  }
  const showProgress = flow && (step.s === 'trial' || step.s === 'shelf' || step.s === 'wait');
  return (
    <FlowColumn>
      {showProgress ? <Progress done={answered} total={Math.max(flow.total, answered)} /> : null}
      {q.reconnecting ? <Reconnecting /> : null}
      {body}
    </FlowColumn>
  );
}
