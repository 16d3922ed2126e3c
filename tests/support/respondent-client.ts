// Calls the respondent route handlers the way the page's script does.
import { randomUUID } from 'node:crypto';
import { POST as start } from '@/app/r/[token]/start/route';
import { POST as answers } from '@/app/r/[token]/answers/route';
import { POST as complete } from '@/app/r/[token]/complete/route';
import { GET as state } from '@/app/r/[token]/state/route';
import type { FlowState, PublicTrial } from '@/respondent/shared/types';
import { callRoute } from './factories';

export type Started = FlowState & { resumeToken: string };

export const startRes = (token: string, body: Record<string, unknown> = { consent: true, segmentAnswers: { household: '2' } }, headers: Record<string, string> = {}) =>
  callRoute(start, { method: 'POST', params: { token }, body, headers });

export async function startOk(token: string, body?: Record<string, unknown>): Promise<Started> {
  const res = await startRes(token, body);
  if (res.status !== 200) throw new Error(`start ${res.status}: ${await res.text()}`);
  return res.json();
}

/** POST /r/[token]/answers with a batch, the resume token in the header as the page sends it. */
export const answersRes = (token: string, rt: string, batch: Record<string, unknown>[], headers: Record<string, string> = {}) =>
  callRoute(answers, { method: 'POST', params: { token }, body: { answers: batch }, headers: { 'x-resume-token': rt, ...headers } });

/** A batch of one answer. */
export const answerRes = (token: string, rt: string, body: Record<string, unknown>) => answersRes(token, rt, [body]);

export const completeRes = (token: string, rt: string) => callRoute(complete, { method: 'POST', params: { token }, headers: { 'x-resume-token': rt } });
export const stateRes = (token: string, rt: string) => callRoute(state, { params: { token }, headers: { 'x-resume-token': rt } });

/** The right answer for a trial as a careful respondent would give it (attention: the correct option). */
export function answerFor(t: PublicTrial, correct = 'Often'): number {
  if (t.kind === 'attention') return t.attention!.options.indexOf(correct);
  return 1;
}

/** Answers every remaining trial in order, in batches of four as the phone sends them; returns how many were sent. */
export async function answerAll(token: string, s: Started): Promise<number> {
  let n = 0;
  for (let i = 0; i < s.upcoming.length; i += 4) {
    const batch = s.upcoming.slice(i, i + 4).map((t) => ({ clientId: randomUUID(), idx: t.idx, answer: answerFor(t), responseMs: 900 }));
    const res = await answersRes(token, s.resumeToken, batch);
    if (res.status !== 200) throw new Error(`answers ${batch[0].idx}…: ${res.status} ${await res.text()}`);
    const acked = (await res.json()).acknowledged as string[];
    if (acked.length !== batch.length) throw new Error(`answers ${batch[0].idx}…: ${acked.length} of ${batch.length} acknowledged`);
    n += batch.length;
  }
  return n;
}
