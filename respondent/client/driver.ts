import type { CompleteReply } from '@/respondent/shared/complete.schema';
import type { FlowState, PublicTrial } from '@/respondent/shared/types';

export interface AnswerPayload {
  clientId: string;
  idx: number;
  answer: number;
  responseMs: number;
}

/** ok, or a failure the flow may retry (network, 5xx) or must show (full, closed, refused). */
export type DriverResult<T> = { ok: true; data: T } | { ok: false; retry: boolean; code: string; message: string };

/** What the screens need from the outside world: the live link (fetch) or the local preview. */
export interface FlowDriver {
  start(segmentAnswers: Record<string, string>): Promise<DriverResult<FlowState>>;
  /** `next` is given by adaptive plans: the trial the staircase places next (null = no more). */
  answer(a: AnswerPayload): Promise<DriverResult<{ next?: PublicTrial | null }>>;
  complete(): Promise<DriverResult<CompleteReply>>;
}

/** A v4 uuid from getRandomValues (randomUUID needs a secure context, phones on plain http lack it). */
export function newClientId(): string {
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6] & 0x0f) | 0x40;
  b[8] = (b[8] & 0x3f) | 0x80;
  const h = Array.from(b, (x) => x.toString(16).padStart(2, '0')).join('');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}
