import type { CompleteReply } from '@/respondent/shared/complete.schema';
import type { FlowState } from '@/respondent/shared/types';
import type { AnswerBatchReply, AnswerInput } from '@/respondent/shared/answer.schema';


/** ok, or a failure the flow may retry (network, 5xx) or must show (full, closed, refused). */
export type DriverResult<T> = { ok: true; data: T } | { ok: false; retry: boolean; code: string; message: string };

/** What the screens need from the outside world: the live link (fetch) or the local preview. */
export interface FlowDriver {
  start(segmentAnswers: Record<string, string>): Promise<DriverResult<FlowState>>;
  /** Sends a batch of stored answers; the reply names those to drop (adaptive plans: and the next trial). */
  sendAnswers(batch: AnswerInput[]): Promise<DriverResult<AnswerBatchReply>>;
  /** Hands a batch to navigator.sendBeacon as the page is hidden or closed; false if not queued. */
  beaconAnswers?(batch: AnswerInput[]): boolean;
  /** Where this respondent's unsent answers are kept on the device; null = in memory only (preview). */
  storageKey(): string | null;
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
