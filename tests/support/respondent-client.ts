// Calls the respondent route handlers the way the page's script does.
import { randomUUID } from 'node:crypto';
import { POST as start } from '@/app/r/[token]/start/route';
import { POST as answer } from '@/app/api/r/[token]/answer/route';
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

export const answerRes = (token: string, rt: string, body: Record<string, unknown>) =>
  callRoute(answer, { method: 'POST', params: { token }, body, headers: { 'x-resume-token': rt } });

export const completeRes = (token: string, rt: string) => callRoute(complete, { method: 'POST', params: { token }, headers: { 'x-resume-token': rt } });
export const stateRes = (token: string, rt: string) => callRoute(state, { params: { token }, headers: { 'x-resume-token': rt } });

/** The right answer for a trial as a careful respondent would give it (attention: the correct option). */
export function answerFor(t: PublicTrial, correct = 'Often'): number {
  if (t.kind === 'attention') return t.attention!.options.indexOf(correct);
  return 1;
}

/** Answers every remaining trial in order; returns how many were sent. */
export async function answerAll(token: string, s: Started): Promise<number> {
  let n = 0;
  for (const t of s.upcoming) {
    const res = await answerRes(token, s.resumeToken, { clientId: randomUUID(), idx: t.idx, answer: answerFor(t), responseMs: 900 });
    if (res.status !== 200) throw new Error(`answer ${t.idx}: ${res.status} ${await res.text()}`);
    n++;
  }
  return n;
}
