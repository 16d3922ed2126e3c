// The answer batch the phone sends to POST /r/[token]/answers, and what the server replies.
// One schema for both sides: the server parses with it, the page's queue builds its requests
// from the inferred types (type-only import, so the zod runtime stays out of the phone's bundle).
//
// Only the four answer fields travel: base price, discount and kind come from the stored plan,
// never from the browser. The resume token may ride in the body because `navigator.sendBeacon`
// (used when the page is hidden or closed) cannot set the x-resume-token header.
import { z } from 'zod';
import type { PublicTrial } from './types';

/** The most answers one request may carry; the phone sends at most this many at a time. */
export const MAX_ANSWERS_PER_BATCH = 32;

export const answerSchema = z.strictObject({
  /** Made on the phone when the answer is given; a retry sends the same id, so it is stored once. */
  clientId: z.uuid(),
  idx: z.number().int().min(0).max(100_000),
  answer: z.number().int().min(0).max(7),
  responseMs: z.number().int().min(0).max(3_600_000),
});

export const answerBatchSchema = z.strictObject({
  resumeToken: z.string().min(1).max(64).optional(),
  answers: z.array(answerSchema).min(1, 'Send at least one answer.').max(MAX_ANSWERS_PER_BATCH, `Send at most ${MAX_ANSWERS_PER_BATCH} answers at a time.`),
});

export type AnswerInput = z.output<typeof answerSchema>;
export type AnswerBatch = z.output<typeof answerBatchSchema>;

/**
 * The reply to a batch. The phone drops from its stored queue exactly the answers named here:
 * `acknowledged` are stored (now or by an earlier try with the same client id); `conflicts` are
 * trials that already hold another answer of this respondent (given in another tab), which
 * stays. `answered` is how many trials the server holds; adaptive plans also get `next`.
 */
export interface AnswerBatchReply {
  acknowledged: string[];
  conflicts: string[];
  answered: number;
  next?: PublicTrial | null;
}
