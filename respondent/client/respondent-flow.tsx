'use client';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { SegmentQuestion } from '@/lib/schemas/study.schema';
import type { Messages } from '@/respondent/messages/format';
import type { FlowState, FlowStudy, PublicTrial } from '@/respondent/shared/types';
import { ConsentScreen } from './consent-screen';
import { newClientId, type FlowDriver } from './driver';
import { InstructionsScreen } from './instructions-screen';
import { PracticeFeedback } from './practice-feedback';
import { PreviewEnd } from './preview-end';
import { QuestionScreen } from './question-screen';
import { ShelfScreen } from './shelf-screen';
import { TrialScreen } from './trial-screen';
import { browserStorage, useAnswerQueue, withRetry } from './use-answer-queue';
import { storedAnswers } from './answer-queue';
import { FlowColumn, Progress, Reconnecting, Stopped, Thanks, Waiting } from './status-screens';

type Step =
  | { s: 'consent' } | { s: 'question'; i: number } | { s: 'intro' } | { s: 'shelf'; again: boolean } | { s: 'trial' }
  | { s: 'feedback'; trial: PublicTrial; answer: number } | { s: 'wait' } | { s: 'thanks' } | { s: 'stopped'; code: string; message: string };

export interface FlowProps {
  driver: FlowDriver;
  /** The study language's catalogue (respondent/messages): every fixed string on the screens. */
  messages: Messages;
  study: FlowStudy;
  consentText: string;
  retentionDays: number;
  questions: SegmentQuestion[];
  /** Set when resuming: the respondent has already agreed. */
  initial: FlowState | null;
  formAction?: string;
  pid?: string | null;
  /** The analyst's preview: the last screen says that nothing was recorded. */
  preview?: boolean;
}

/** After the instructions: spot the saving shows the remembered shelf first. */
const afterIntro = (state: FlowState): Step => (state.study.task === 'spot' ? { s: 'shelf', again: state.answered > 0 } : { s: 'trial' });

function firstStep(initial: FlowState | null, questions: SegmentQuestion[]): Step {
  if (!initial) return { s: 'consent' };
  if (initial.phase === 'completed') return { s: 'thanks' };
  if (initial.phase === 'questions') return questions.length ? { s: 'question', i: 0 } : { s: 'wait' };
  if (initial.phase === 'done' || !initial.upcoming.length) return { s: 'wait' };
  // The instructions come before the practice (again on a resume during the practice).
  if (initial.answered === 0 || initial.upcoming[0].kind === 'practice') return { s: 'intro' };
  return afterIntro(initial);
}

/**
 * The server's state of a resumed respondent, moved on by the answers this device still holds
 * unsent (the tab was closed or crashed before they went): those trials are not shown again.
 * Adaptive plans learn their next trial once the held answers are acknowledged.
 */
function withHeldAnswers(initial: FlowState | null, held: readonly { idx: number }[]): FlowState | null {
  if (!initial || initial.phase !== 'trials') return initial;
  const ahead = new Set(held.filter((a) => a.idx >= initial.answered).map((a) => a.idx));
  if (!ahead.size) return initial;
  const upcoming = initial.adaptive ? [] : initial.upcoming.filter((t) => !ahead.has(t.idx));
  return { ...initial, upcoming, answered: initial.answered + ahead.size, phase: upcoming.length || initial.adaptive ? 'trials' : 'done' };
}

/** consent → segment questions → (shelf) → practice and trials → thank you; a small state machine. */
export function RespondentFlow(p: FlowProps) {
  const [initial] = useState(() => withHeldAnswers(p.initial, storedAnswers(browserStorage(), p.driver.storageKey())));
  const [step, setStep] = useState<Step>(() => firstStep(initial, p.questions));
  const [flow, setFlow] = useState<FlowState | null>(initial);
  const [upcoming, setUpcoming] = useState<PublicTrial[]>(initial?.upcoming ?? []);
  const [answered, setAnswered] = useState(initial?.answered ?? 0);
  const [answers, setAnswers] = useState<Record<string, string>>({});
  const [starting, setStarting] = useState(false);
  // Read by the answer queue's reply handler, which must not jump over instructions or feedback.
  const stepNow = useRef(step);
  const noMoreTrials = useRef(false);
  const column = useRef<HTMLDivElement>(null);
  const firstRender = useRef(true);

  useEffect(() => {
    stepNow.current = step;
    // A new screen starts at the top, its heading focused (announced, and Tab goes on from it).
    if (firstRender.current) { firstRender.current = false; return; }
    const h = column.current?.querySelector('h1');
    if (h) { h.tabIndex = -1; h.classList.add('focus:outline-none'); h.focus({ preventScroll: true }); }
    if (column.current && column.current.getBoundingClientRect().top < 0) column.current.scrollIntoView({ block: 'start' });
  }, [step]);

  const m = p.messages;
  // A respondent the server cannot find has no study (and no language) behind it: the flow words that one itself.
  const stop = useCallback((code: string, message: string) => setStep({ s: 'stopped', code, message: code === 'not_found' ? m.stop.lost : message }), [m]);

  const q = useAnswerQueue(p.driver);

  // Callers are already on the waiting step when they finish: every stored answer is
  // acknowledged first (the server refuses to complete while answers are missing).
  const finish = useCallback(async () => {
    if (!(await q.queue.drain())) return; // stopped: the queue has said why
    const r = await withRetry(() => p.driver.complete(), q.setReconnecting);
    if (!r.ok) return stop(r.code, r.message);
    if (r.data.redirectUrl) window.location.assign(r.data.redirectUrl);
    else setStep({ s: 'thanks' });
  }, [p.driver, q, stop]);

  useEffect(() => {
    q.queue.listen({
      immediate: () => !!flow?.adaptive,
      onReply: (reply) => {
        // Adaptive plans: the reply places the next trial (null = none left).
        if (reply.next === undefined) return;
        setUpcoming(reply.next ? [reply.next] : []);
        noMoreTrials.current = !reply.next;
        // Instructions and practice feedback stay until the respondent moves on (continueFrom reads upcoming).
        if (stepNow.current.s === 'feedback' || stepNow.current.s === 'intro') return;
        if (!reply.next) { setStep({ s: 'wait' }); void finish(); }
        else setStep(reply.next.refresh && flow?.study.task === 'spot' ? { s: 'shelf', again: true } : { s: 'trial' });
      },
      onStopped: stop,
    });
  });

  useEffect(() => {
    // Resumed: answers this device still holds go first; after the last answer, complete.
    if (q.queue.pending.length) q.queue.flush();
    if (initial?.phase !== 'done') return;
    const t = setTimeout(() => void finish(), 0);
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
    q.queue.adopt(); // a start that resumed: answers this device held for that respondent
    const state = withHeldAnswers(r.data, q.queue.pending)!;
    setFlow(state);
    setUpcoming(state.upcoming);
    setAnswered(state.answered);
    if (q.queue.pending.length) q.queue.flush();
    const next = firstStep(state, []);
    if (next.s === 'wait' && state.phase === 'done') void finish();
    else setStep(next);
  }

  function answerQuestion(option: string, i: number) {
    const id = p.questions[i].id;
    const all = { ...answers, [id]: option };
    setAnswers(all);
    if (i + 1 < p.questions.length) setStep({ s: 'question', i: i + 1 });
    else void begin(all);
  }

  /** The next screen once a trial (and any practice feedback) is done with. */
  function continueFrom(rest: PublicTrial[]) {
    if (rest.length) setStep(rest[0].refresh && flow?.study.task === 'spot' ? { s: 'shelf', again: true } : { s: 'trial' });
    else {
      // Adaptive plans learn the next trial from the reply; fixed ones complete once all are acknowledged.
      setStep({ s: 'wait' });
      if (!flow?.adaptive || noMoreTrials.current) void finish();
    }
  }

  function answerTrial(trial: PublicTrial, answer: number, ms: number) {
    // Stored on the device at once; sent with the next batch (adaptive plans: right away).
    // Practice answers go too (the server keeps them as practice, never analysed): the plan is answered in order.
    q.queue.push({ clientId: newClientId(), idx: trial.idx, answer, responseMs: Math.max(0, Math.round(ms)) });
    setAnswered((n) => n + 1);
    const rest = upcoming.slice(1);
    setUpcoming(rest);
    if (trial.kind === 'practice') setStep({ s: 'feedback', trial, answer });
    else continueFrom(rest);
  }

  const study = flow?.study ?? p.study;
  const current = upcoming[0];
  let body: React.ReactNode;
  if (step.s === 'consent') {
    body = <ConsentScreen m={m} consentText={p.consentText} contact={p.study.contact} retentionDays={p.retentionDays} action={p.formAction} pid={p.pid}
      onAgree={() => (p.questions.length ? setStep({ s: 'question', i: 0 }) : void begin({}))} />;
  } else if (step.s === 'question') {
    body = <QuestionScreen m={m} key={step.i} question={p.questions[step.i]} n={step.i + 1} of={p.questions.length} onAnswer={(o) => answerQuestion(o, step.i)} />;
  } else if (step.s === 'intro' && flow) {
    body = <InstructionsScreen m={m} study={study} practice={Math.max(0, flow.practice - answered)} questions={Math.max(0, flow.total - flow.practice)}
      onStart={() => setStep(afterIntro({ ...flow, answered }))} />;
  } else if (step.s === 'feedback' && flow) {
    body = <PracticeFeedback m={m} study={study} trial={step.trial} answer={step.answer} last={answered >= flow.practice} onNext={() => continueFrom(upcoming)} />;
  } else if (step.s === 'shelf' && flow) {
    body = <ShelfScreen m={m} study={study} shelf={flow.shelf} again={step.again} onDone={() => setStep(upcoming.length ? { s: 'trial' } : { s: 'wait' })} />;
  } else if (step.s === 'trial' && current) {
    body = <TrialScreen m={m} key={current.idx} study={study} trial={current} onAnswer={(a, ms) => answerTrial(current, a, ms)} />;
  } else if (step.s === 'thanks') {
    body = p.preview ? <PreviewEnd m={m} /> : <Thanks m={m} referenceCode={flow?.referenceCode} />;
  } else if (step.s === 'stopped') {
    body = <Stopped m={m} code={step.code} message={step.message} />;
  } else {
    body = <Waiting m={m} />;
  }
  const showProgress = flow && (step.s === 'trial' || step.s === 'shelf' || step.s === 'wait' || step.s === 'feedback');
  let progress: React.ReactNode = null;
  if (showProgress) {
    const practice = step.s === 'feedback' ? { n: answered, of: flow.practice } : answered < flow.practice ? { n: answered + 1, of: flow.practice } : undefined;
    progress = <Progress m={m} done={Math.max(0, answered - flow.practice)} total={Math.max(flow.total, answered) - flow.practice} practice={practice} />;
  }
  return (
    <FlowColumn ref={column}>
      {progress}
      {q.reconnecting ? <Reconnecting m={m} /> : null}
      {body}
    </FlowColumn>
  );
}
