import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { randomUUID } from 'node:crypto';
import { AnswerQueue, ANSWERS_PER_REQUEST, queueStorageKey, type AnswerQueueOptions, type QueueStorage, type SendResult } from '@/respondent/client/answer-queue';
import { MAX_ANSWERS_PER_BATCH, type AnswerInput } from '@/respondent/shared/answer.schema';

// The phone's answer queue (respondent/client/answer-queue.ts) with a fake server and a fake
// localStorage: protects "nothing lost" (an answer leaves the device only when the server names
// it), "no duplicates" (a retry carries the same client ids), and the batching rules.

class FakeStorage implements QueueStorage {
  data = new Map<string, string>();
  getItem(k: string) { return this.data.get(k) ?? null; }
  setItem(k: string, v: string) { this.data.set(k, v); }
  removeItem(k: string) { this.data.delete(k); }
}

const KEY = queueStorageKey('resume-token-1');
const answer = (idx: number): AnswerInput => ({ clientId: randomUUID(), idx, answer: 1, responseMs: 700 });
const ack = (batch: AnswerInput[], over: Partial<{ acknowledged: string[]; conflicts: string[] }> = {}): SendResult =>
  ({ ok: true, data: { acknowledged: batch.map((a) => a.clientId), conflicts: [], answered: batch.at(-1)!.idx + 1, ...over } });
const networkDown: SendResult = { ok: false, retry: true, code: 'network', message: 'No connection.' };

/** Most cases below use batches of 4 (any size shows the rule); `batchAnswers: undefined` gives the phone's default (8). */
function setup(opts: Partial<AnswerQueueOptions> = {}, storage = new FakeStorage()) {
  const sent: AnswerInput[][] = [];
  let reply: (batch: AnswerInput[]) => SendResult = (b) => ack(b);
  const send = vi.fn(async (batch: AnswerInput[]) => { sent.push(batch.map((a) => ({ ...a }))); return reply(batch); });
  const events = { retrying: [] as boolean[], stopped: [] as string[] };
  const q = new AnswerQueue({
    send, storage, storageKey: () => KEY, batchAnswers: 4,
    onRetrying: (on) => events.retrying.push(on),
    onStopped: (code) => events.stopped.push(code),
    ...opts,
  });
  const stored = () => JSON.parse(storage.getItem(KEY) ?? '[]') as AnswerInput[];
  return { q, send, sent, storage, stored, events, setReply: (f: typeof reply) => { reply = f; } };
}

describe('the answer queue on the phone', () => {
  beforeEach(() => { vi.useFakeTimers(); });
  afterEach(() => { vi.useRealTimers(); });

  it('stores each answer on the device before anything is sent, sends eight as one batch, and drops them once acknowledged', async () => {
    const { q, send, sent, stored } = setup({ batchAnswers: undefined });
    const a = [0, 1, 2, 3, 4, 5, 6, 7].map(answer);
    for (const x of a.slice(0, 7)) q.push(x);
    await vi.advanceTimersByTimeAsync(0);
    expect(send).not.toHaveBeenCalled();
    expect(stored().map((x) => x.clientId)).toEqual(a.slice(0, 7).map((x) => x.clientId));
    q.push(a[7]);
    await vi.advanceTimersByTimeAsync(0);
    expect(sent).toEqual([a]);
    expect(stored()).toEqual([]);
    expect(q.pending).toHaveLength(0);
  });

  it('sends what waits 3 s after the latest answer (each answer restarts the clock), not before', async () => {
    const { q, sent } = setup();
    const a0 = answer(0);
    q.push(a0);
    await vi.advanceTimersByTimeAsync(2000);
    const a1 = answer(1);
    q.push(a1);
    await vi.advanceTimersByTimeAsync(2999);
    expect(sent).toHaveLength(0);
    await vi.advanceTimersByTimeAsync(1);
    expect(sent).toEqual([[a0, a1]]);
  });

  it('a shopper answering every 2 s sends eight at a time; with the oldest-answer clock an answer waits at most 3 s', async () => {
    const steady = setup({ batchAnswers: undefined });
    for (let i = 0; i < 16; i++) {
      steady.q.push(answer(i));
      await vi.advanceTimersByTimeAsync(2000);
    }
    expect(steady.sent.map((b) => b.length)).toEqual([8, 8]);

    const capped = setup({ batchClock: 'oldest-answer' });
    for (let i = 0; i < 8; i++) {
      capped.q.push(answer(i));
      await vi.advanceTimersByTimeAsync(2000);
    }
    expect(capped.sent.map((b) => b.length)).toEqual([2, 2, 2, 2]);
  });

  it('drops only the answers the server names; the rest stays stored and goes in the next batch', async () => {
    const { q, sent, stored, setReply } = setup();
    const a = [0, 1, 2, 3].map(answer);
    // The server names two as stored and one as a trial another tab answered; the fourth is not named.
    setReply((b) => ack(b, { acknowledged: [b[0].clientId, b[1].clientId], conflicts: [b[2].clientId] }));
    for (const x of a) q.push(x);
    await vi.advanceTimersByTimeAsync(0);
    expect(sent).toHaveLength(1);
    expect(stored().map((x) => x.clientId)).toEqual([a[3].clientId]);
    setReply((b) => ack(b));
    await vi.advanceTimersByTimeAsync(3000);
    expect(sent[1]).toEqual([a[3]]);
    expect(stored()).toEqual([]);
  });

  it('a failed send keeps every answer stored and retries the same batch (same ids) with growing backoff', async () => {
    const { q, sent, stored, events, setReply } = setup();
    setReply(() => networkDown);
    const a = [0, 1, 2, 3].map(answer);
    for (const x of a) q.push(x);
    await vi.advanceTimersByTimeAsync(0);
    expect(sent).toHaveLength(1);
    expect(events.retrying).toEqual([true]);
    await vi.advanceTimersByTimeAsync(999);
    expect(sent).toHaveLength(1); // first retry after 1 s
    await vi.advanceTimersByTimeAsync(1);
    expect(sent).toHaveLength(2);
    await vi.advanceTimersByTimeAsync(1999);
    expect(sent).toHaveLength(2); // then after 2 s
    await vi.advanceTimersByTimeAsync(1);
    expect(sent).toHaveLength(3);
    expect(stored()).toHaveLength(4);
    setReply((b) => ack(b));
    await vi.advanceTimersByTimeAsync(4000);
    expect(sent).toHaveLength(4);
    for (const batch of sent) expect(batch.map((x) => x.clientId)).toEqual(a.map((x) => x.clientId));
    expect(stored()).toEqual([]);
    expect(events.retrying).toEqual([true, false]);
  });

  it('offline: waits for the browser to be online again instead of the backoff, then retries at once', async () => {
    let online = false;
    const { q, sent, setReply } = setup({ isOnline: () => online });
    setReply(() => networkDown);
    for (const x of [0, 1, 2, 3].map(answer)) q.push(x);
    await vi.advanceTimersByTimeAsync(5000);
    expect(sent).toHaveLength(1);
    online = true;
    setReply((b) => ack(b));
    q.online();
    await vi.advanceTimersByTimeAsync(0);
    expect(sent).toHaveLength(2);
    expect(q.pending).toHaveLength(0);
  });

  it('a refusal a retry cannot change (study closed) stops the queue and keeps the answers stored', async () => {
    const { q, sent, stored, events, setReply } = setup();
    setReply(() => ({ ok: false, retry: false, code: 'gone', message: 'This study is closed.' }));
    for (const x of [0, 1, 2, 3].map(answer)) q.push(x);
    await vi.advanceTimersByTimeAsync(60_000);
    expect(sent).toHaveLength(1);
    expect(events.stopped).toEqual(['gone']);
    expect(stored()).toHaveLength(4);
    expect(await q.drain()).toBe(false);
  });

  it('resume (this tab reloaded, another tab, after a crash): the stored answers are read back and sent first, in trial order', async () => {
    const storage = new FakeStorage();
    const left = [answer(5), answer(6)];
    storage.setItem(KEY, JSON.stringify([left[1], left[0], { junk: true }]));
    const { q, sent } = setup({}, storage);
    expect(q.pending.map((x) => x.idx)).toEqual([5, 6]);
    q.flush();
    await vi.advanceTimersByTimeAsync(0);
    expect(sent).toEqual([left]);
    expect(storage.getItem(KEY)).toBeNull();
  });

  it('answers another tab stored under the same key meanwhile are kept and sent too, never overwritten', async () => {
    const { q, sent, storage, stored } = setup();
    const mine = answer(0);
    q.push(mine);
    const theirs = answer(1);
    storage.setItem(KEY, JSON.stringify([mine, theirs]));
    q.push(answer(2));
    expect(stored().map((x) => x.idx)).toEqual([0, 1, 2]);
    expect(await q.drain()).toBe(true);
    expect(sent.flat().map((x) => x.clientId)).toContain(theirs.clientId);
    expect(stored()).toEqual([]);
  });

  it('drain sends everything now (completing waits for it) and resolves true once the queue is empty', async () => {
    const { q, sent } = setup();
    q.push(answer(0));
    const drained = q.drain();
    await vi.advanceTimersByTimeAsync(0);
    expect(await drained).toBe(true);
    expect(sent).toHaveLength(1);
  });

  it('page hidden or closed: what waits goes by beacon and stays stored until a reply names it', async () => {
    const beacon = vi.fn(() => true);
    const { q, stored, send } = setup({ beacon });
    const a = [answer(0), answer(1)];
    for (const x of a) q.push(x);
    q.pageHidden();
    expect(beacon).toHaveBeenCalledWith(a);
    expect(send).not.toHaveBeenCalled();
    expect(stored()).toHaveLength(2);
  });

  it('a batch is an unbroken run of trials of at most the server\'s limit; adaptive plans send each answer at once', async () => {
    expect(ANSWERS_PER_REQUEST).toBeLessThanOrEqual(MAX_ANSWERS_PER_BATCH);
    // A backlog (offline for a while) read back on resume, with a hole before the last answer.
    const storage = new FakeStorage();
    const many = Array.from({ length: ANSWERS_PER_REQUEST + 3 }, (_, i) => answer(i));
    const gap = answer(ANSWERS_PER_REQUEST + 10);
    storage.setItem(KEY, JSON.stringify([...many, gap]));
    const { q, sent } = setup({}, storage);
    expect(await q.drain()).toBe(true);
    expect(sent.map((b) => b.length)).toEqual([ANSWERS_PER_REQUEST, 3, 1]);

    const adaptive = setup({ immediate: () => true });
    adaptive.q.push(answer(0));
    await vi.advanceTimersByTimeAsync(0);
    expect(adaptive.sent).toHaveLength(1);
  });

  it('without storage (blocked, or the preview) the queue still sends from memory', async () => {
    const send = vi.fn(async (b: AnswerInput[]) => ack(b));
    const q = new AnswerQueue({ send, storage: null, storageKey: () => null });
    for (const x of [0, 1, 2, 3, 4, 5, 6, 7].map(answer)) q.push(x);
    await vi.advanceTimersByTimeAsync(0);
    expect(send).toHaveBeenCalledTimes(1);
    expect(q.pending).toHaveLength(0);
  });
});
