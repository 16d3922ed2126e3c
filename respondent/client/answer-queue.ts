// The phone's answer queue: every answer is written to the device first (localStorage, one key
// per resume token) and sent in small batches, so that a lost connection, a closed tab or a
// crashed browser loses nothing and a shopper never waits on the network between trials.
//
// - A batch goes when 8 answers are waiting or 3 s have passed without a new one, whichever
//   comes first; adaptive plans send each answer at once (the next trial depends on the reply).
//   The clock restarts with each answer: a shopper answering every 2 s sends 8 at a time (one
//   request per 16 s, which is what lets one small server hold thousands of them), and a shopper
//   who pauses has sent everything 3 s later. Why 8, not 4: measured on the 2-core machine
//   (docs/reliability.md → Load), batches of 4 passed the 150 ms p99 limit at 1,500 shoppers (153 ms),
//   batches of 8 held 2,500 at p99 65 ms; the price is that the fieldwork monitor sees answers up to ~16 s later. Answers never wait unsafely meanwhile: they are
//   on the device, and a hidden or closed page sends them at once (below).
// - One request at a time, oldest answers first, each with the client id it was given when
//   answered: a retry after a lost reply is the same batch, which the server stores once.
// - Only answers the server names in its reply (acknowledged, or a trial another tab already
//   answered) leave the device. A failure keeps them; network errors, 5xx and 429 are retried
//   with exponential backoff (1 s doubling to 15 s), at once when the browser comes back online.
// - When the page is hidden or closed, what is waiting goes by navigator.sendBeacon (the
//   resume token in the body, as a beacon cannot set headers) and also stays stored: the next
//   load of the link (this tab, another tab, after a crash) sends it again first.
// Plain TypeScript with no React or DOM globals, so the load bench and the fault tests drive
// respondents with this same queue (scripts/load/respondent-client.ts).
import type { AnswerBatchReply, AnswerInput } from '@/respondent/shared/answer.schema';

/** ok, or a failure the queue may retry (network, 5xx, 429) or must report (closed, refused). */
export type SendResult = { ok: true; data: AnswerBatchReply } | { ok: false; retry: boolean; code: string; message: string };

export const BATCH_ANSWERS = 8;
export const BATCH_WAIT_MS = 3000;
/** Answers per request after a backlog (offline for a while); at most MAX_ANSWERS_PER_BATCH in answer.schema.ts. */
export const ANSWERS_PER_REQUEST = 16;
const BACKOFF_MS = 1000;
const MAX_BACKOFF_MS = 15_000;

/** The part of the Web Storage API the queue uses. */
export interface QueueStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

export interface AnswerQueueOptions {
  send(batch: AnswerInput[]): Promise<SendResult>;
  /** Hands the batch to navigator.sendBeacon; false when the browser would not queue it. */
  beacon?(batch: AnswerInput[]): boolean;
  storage?: QueueStorage | null;
  /** The storage key; null until the respondent has a resume token (and always in the preview). */
  storageKey(): string | null;
  /** Send every answer at once instead of in batches (adaptive plans); asked each time. */
  immediate?(): boolean;
  isOnline?(): boolean;
  onReply?(reply: AnswerBatchReply): void;
  onRetrying?(on: boolean): void;
  onStopped?(code: string, message: string): void;
  batchAnswers?: number;
  batchWaitMs?: number;
  /** What starts the wait: the latest answer (default) or the oldest unsent one (a hard cap on its age). */
  batchClock?: 'latest-answer' | 'oldest-answer';
  backoffMs?: number;
  maxBackoffMs?: number;
}

export const queueStorageKey = (resumeToken: string) => `nw-answers:${resumeToken}`;

const isAnswer = (a: unknown): a is AnswerInput =>
  !!a && typeof a === 'object' && typeof (a as AnswerInput).clientId === 'string' && Number.isInteger((a as AnswerInput).idx)
  && Number.isInteger((a as AnswerInput).answer) && Number.isInteger((a as AnswerInput).responseMs);

/** Answers stored on this device for a key (empty when none, unreadable or storage is blocked). */
export function storedAnswers(storage: QueueStorage | null | undefined, key: string | null): AnswerInput[] {
  if (!storage || !key) return [];
  try {
    const raw = JSON.parse(storage.getItem(key) ?? '[]') as unknown;
    return Array.isArray(raw) ? raw.filter(isAnswer).sort((x, y) => x.idx - y.idx) : [];
  } catch {
    return [];
  }
}

export class AnswerQueue {
  private items: AnswerInput[];
  private timer: ReturnType<typeof setTimeout> | null = null;
  private wake: (() => void) | null = null;
  private pumping: Promise<void> | null = null;
  private draining = 0;
  private stopped = false;
  private retrying = false;
  private readonly idle = new Set<() => void>();

  constructor(private o: AnswerQueueOptions) {
    this.items = storedAnswers(o.storage, o.storageKey());
  }

  /** Replaces the callbacks (a page passes its latest ones after each render). */
  listen(handlers: Pick<AnswerQueueOptions, 'immediate' | 'onReply' | 'onStopped'>): void {
    this.o = { ...this.o, ...handlers };
  }

  /** Answers not yet acknowledged (stored on the device), oldest first. */
  get pending(): readonly AnswerInput[] {
    return this.items;
  }

  get isStopped(): boolean {
    return this.stopped;
  }

  /** Takes in answers stored under the key, which becomes known once the respondent has started (or resumed). */
  adopt(): void {
    const known = new Set(this.items.map((x) => x.clientId));
    const stored = storedAnswers(this.o.storage, this.o.storageKey()).filter((x) => !known.has(x.clientId));
    if (stored.length) this.items = [...this.items, ...stored].sort((x, y) => x.idx - y.idx);
  }

  /** Stores one answer on the device and sends it when its batch is due. */
  push(a: AnswerInput): void {
    if (!this.items.some((x) => x.clientId === a.clientId)) this.items = [...this.items, a].sort((x, y) => x.idx - y.idx);
    this.persist();
    if (this.timer && this.o.batchClock !== 'oldest-answer') { clearTimeout(this.timer); this.timer = null; }
    this.schedule();
  }

  /** Sends what is waiting now, batch after batch, until the queue is empty or stopped; true when empty. */
  async drain(): Promise<boolean> {
    this.draining++;
    try {
      while (this.items.length && !this.stopped) {
        this.kick();
        await this.pumping;
      }
      return !this.items.length;
    } finally {
      this.draining--;
    }
  }

  /** Starts sending now whatever waits (resume: the previous page's answers go first). */
  flush(): void {
    this.kick();
  }

  /** The page is being hidden or closed: hand what waits to the browser's beacon; it stays stored too. */
  pageHidden(): void {
    if (!this.items.length || !this.o.beacon) return;
    this.o.beacon(this.nextBatch());
  }

  /** The browser is online again: a retry waiting on its backoff goes now. */
  online(): void {
    this.wake?.();
  }

  /** Resolves once nothing is waiting (or the queue stopped). */
  whenIdle(): Promise<void> {
    if (!this.items.length || this.stopped) return Promise.resolve();
    return new Promise((resolve) => this.idle.add(resolve));
  }

  dispose(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    this.stopped = true;
    this.wake?.();
    this.settle();
  }

  /**
   * Writes the queue to the device. Another tab of the same respondent may have stored answers
   * under this key meanwhile: they are merged in (and sent by this tab too), never overwritten;
   * only the answers this tab just saw acknowledged are left out.
   */
  private persist(dropped: ReadonlySet<string> = new Set()): void {
    const key = this.o.storageKey();
    if (!this.o.storage || !key) return;
    const known = new Set(this.items.map((x) => x.clientId));
    const others = storedAnswers(this.o.storage, key).filter((x) => !known.has(x.clientId) && !dropped.has(x.clientId));
    if (others.length) this.items = [...this.items, ...others].sort((x, y) => x.idx - y.idx);
    try {
      if (this.items.length) this.o.storage.setItem(key, JSON.stringify(this.items));
      else this.o.storage.removeItem(key);
    } catch {
      // Storage full or blocked (private mode): the answers still live in memory and are sent.
    }
  }

  /** The oldest answers in an unbroken run of trials: the server stores no trial after a missing one. */
  private nextBatch(): AnswerInput[] {
    const batch = [this.items[0]];
    for (let i = 1; i < this.items.length && batch.length < ANSWERS_PER_REQUEST && this.items[i].idx === batch[batch.length - 1].idx + 1; i++) batch.push(this.items[i]);
    return batch;
  }

  private due(): boolean {
    return this.draining > 0 || !!this.o.immediate?.() || this.items.length >= (this.o.batchAnswers ?? BATCH_ANSWERS);
  }

  private schedule(): void {
    if (this.stopped || this.pumping) return;
    if (!this.items.length) return this.settle();
    if (this.due()) return this.kick();
    // Started by the latest answer (push() restarts it) or, with 'oldest-answer', by the oldest waiting one.
    this.timer ??= setTimeout(() => { this.timer = null; this.kick(); }, this.o.batchWaitMs ?? BATCH_WAIT_MS);
  }

  private kick(): void {
    if (this.timer) { clearTimeout(this.timer); this.timer = null; }
    if (this.pumping || this.stopped || !this.items.length) return;
    this.pumping = this.pump().finally(() => {
      this.pumping = null;
      this.schedule();
    });
  }

  private settle(): void {
    for (const resolve of this.idle) resolve();
    this.idle.clear();
  }

  private setRetrying(on: boolean): void {
    if (this.retrying === on) return;
    this.retrying = on;
    this.o.onRetrying?.(on);
  }

  private async pump(): Promise<void> {
    let attempt = 0;
    let sent = false;
    // After one batch, the rest goes at once only when it is due by itself (or a drain asks).
    while (this.items.length && !this.stopped && (!sent || this.due())) {
      const batch = this.nextBatch();
      const r = await this.o.send(batch);
      if (this.stopped) return;
      if (r.ok) {
        const drop = new Set([...r.data.acknowledged, ...r.data.conflicts]);
        if (batch.some((a) => drop.has(a.clientId))) {
          attempt = 0;
          sent = true;
          this.setRetrying(false);
          this.items = this.items.filter((a) => !drop.has(a.clientId));
          this.persist(drop);
          this.o.onReply?.(r.data);
          continue;
        }
        // A reply that names none of the batch cannot happen with this server; never spin on it.
      } else if (!r.retry) {
        // Refused for a reason a retry cannot change (study closed, respondent completed …):
        // the answers stay stored and the flow says why it stopped.
        this.stopped = true;
        this.setRetrying(false);
        this.o.onStopped?.(r.code, r.message);
        this.settle();
        return;
      }
      this.setRetrying(true);
      await this.backoff(attempt++);
    }
  }

  /** Waits before a retry: exponential, cut short when the browser reports it is online again. */
  private backoff(attempt: number): Promise<void> {
    const ms = Math.min(this.o.maxBackoffMs ?? MAX_BACKOFF_MS, (this.o.backoffMs ?? BACKOFF_MS) * 2 ** attempt);
    return new Promise((resolve) => {
      const done = () => { clearTimeout(t); this.wake = null; resolve(); };
      // Offline: no point in a timer firing into a dead connection; wait for 'online' (or the cap).
      const t = setTimeout(done, this.o.isOnline && !this.o.isOnline() ? (this.o.maxBackoffMs ?? MAX_BACKOFF_MS) : ms);
      this.wake = done;
    });
  }
}
