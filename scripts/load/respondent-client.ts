// Simulated respondents over real HTTP (keep-alive), doing what the respondent page's script
// does: start, give one answer after another, send them with the page's own answer queue
// (respondent/client/answer-queue.ts: 8 answers at a time or 3 s after the latest, one request
// at a time, the same client ids on every retry), wait until every answer is acknowledged,
// complete. A start or
// complete that meets a network error, 5xx or 429 is retried with backoff, as the page does.
import http from 'node:http';
import { randomUUID } from 'node:crypto';
import { AnswerQueue, type SendResult } from '../../respondent/client/answer-queue';
import type { AnswerInput } from '../../respondent/shared/answer.schema';

export interface Reply { status: number; body: unknown; ms: number }
export interface ClientStats {
  /** Latency of every respondent request (start, answer batch, complete), ms. */
  requestMs: number[];
  /** Latency of the answer batch requests only, ms. */
  answerMs: number[];
  /** Latency of starts and completes (they take the workspace's seat lock), ms. */
  seatMs: number[];
  /** From an answer being given on the phone to its acknowledgement, ms (what a slow server costs the phone). */
  ackDelayMs: number[];
  answersGiven: number;
  answersAcked: number;
  /** Answers the server named as conflicts (a trial already answered otherwise): none expected here. */
  conflicts: number;
  batches: number;
  starts: number;
  completes: number;
  errors: Record<string, number>;
  retries: number;
  /** Client ids acknowledged since the caller last emptied this list (checked against the database). */
  ackedIds: string[];
}

export const newStats = (): ClientStats => ({
  requestMs: [], answerMs: [], seatMs: [], ackDelayMs: [], answersGiven: 0, answersAcked: 0, conflicts: 0, batches: 0, starts: 0, completes: 0, errors: {}, retries: 0, ackedIds: [],
});

const agent = new http.Agent({ keepAlive: true, maxSockets: 4096 });

/** One request; network failures come back as status 0. */
export function request(base: string, method: string, path: string, body?: unknown, headers: Record<string, string> = {}, raw?: string): Promise<Reply> {
  const t = performance.now();
  const data = raw !== undefined ? Buffer.from(raw) : body === undefined ? undefined : Buffer.from(JSON.stringify(body));
  const u = new URL(path, base);
  return new Promise((resolve) => {
    const req = http.request({ host: u.hostname, port: u.port, path: u.pathname + u.search, method, agent, headers: { ...(data ? { 'content-type': 'application/json', 'content-length': String(data.length) } : {}), ...headers }, timeout: 30_000 }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        let parsed: unknown = null;
        try { parsed = JSON.parse(Buffer.concat(chunks).toString('utf8')); } catch { /* not JSON */ }
        resolve({ status: res.statusCode ?? 0, body: parsed, ms: performance.now() - t });
      });
      res.on('error', () => resolve({ status: 0, body: null, ms: performance.now() - t }));
    });
    req.on('timeout', () => req.destroy(new Error('timeout')));
    req.on('error', () => resolve({ status: 0, body: null, ms: performance.now() - t }));
    if (data) req.write(data);
    req.end();
  });
}

/** The link's respondent endpoints, all under /r/[token] (respondent/shared/urls.ts says the same for the page). */
export const respondentPaths = (linkToken: string) => ({
  start: `/r/${linkToken}/start`,
  answers: `/r/${linkToken}/answers`,
  complete: `/r/${linkToken}/complete`,
});

const retryable = (s: number) => s === 0 || s >= 500 || s === 429;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export interface RespondentOptions {
  /** One base URL, or several: each request goes to the next (two instances behind a balancer). */
  bases: string[];
  linkToken: string;
  stats: ClientStats;
  /** One answer every this many ms, on schedule whatever the replies do (open loop); 0 = all at once. */
  answerEveryMs?: number;
  /** Delay before the first answer (spreads respondents' clocks). */
  firstAnswerAfterMs?: number;
  /** Backoff of the first retry (doubles, capped at maxBackoffMs); the page uses 1 s … 15 s. */
  backoffMs?: number;
  maxBackoffMs?: number;
  /** Give up after this long of failed retries for one request. */
  giveUpMs?: number;
  /** Asked before each answer: true = give no more answers (send what was given, do not complete). */
  stopAnswering?: () => boolean;
  /** The page's batch rule (8 answers, or 3 s after the latest) unless given, to show what another rule would do. */
  batchAnswers?: number;
  batchWaitMs?: number;
  batchClock?: 'latest-answer' | 'oldest-answer';
  /** Called once the start has returned. */
  onStarted?: () => void;
}

interface Trial { idx: number; kind: string; attention?: { options: string[] } }

/** Runs one respondent from start to complete; resolves with the number of answers acknowledged. */
export async function runRespondent(o: RespondentOptions): Promise<number> {
  let turn = Math.floor(Math.random() * o.bases.length);
  const paths = respondentPaths(o.linkToken);
  // Each respondent on its own (benchmarking-range, RFC 2544) address, as the proxy in front would say.
  const ip = { 'x-forwarded-for': `198.18.${Math.floor(Math.random() * 256)}.${Math.floor(Math.random() * 256)}` };
  const send = async (path: string, body: unknown, headers: Record<string, string>, what: string, record: number[]) => {
    const startedAt = Date.now();
    for (let attempt = 0; ; attempt++) {
      const r = await request(o.bases[turn++ % o.bases.length], 'POST', path, body, { ...ip, ...headers });
      o.stats.requestMs.push(r.ms);
      record.push(r.ms);
      if (!retryable(r.status)) return r;
      o.stats.errors[`${what} ${r.status}`] = (o.stats.errors[`${what} ${r.status}`] ?? 0) + 1;
      if (Date.now() - startedAt > (o.giveUpMs ?? 120_000)) return r;
      o.stats.retries++;
      await sleep(Math.min(o.maxBackoffMs ?? 2000, (o.backoffMs ?? 100) * 2 ** attempt));
    }
  };
  const started = await send(paths.start, { consent: true, segmentAnswers: { household: '2' } }, {}, 'start', o.stats.seatMs);
  if (started.status !== 200) throw new Error(`start ${started.status}: ${JSON.stringify(started.body)}`);
  o.stats.starts++;
  o.onStarted?.();
  const s = started.body as { resumeToken: string; upcoming: Trial[] };
  const auth = { 'x-resume-token': s.resumeToken };

  const givenAt = new Map<string, number>();
  let acked = 0;
  let failingSince = 0;
  let stopped: string | null = null;
  const queue = new AnswerQueue({
    storage: null,
    storageKey: () => null,
    batchAnswers: o.batchAnswers,
    batchWaitMs: o.batchWaitMs,
    batchClock: o.batchClock,
    backoffMs: o.backoffMs ?? 100,
    maxBackoffMs: o.maxBackoffMs ?? 2000,
    onStopped: (code, message) => { stopped = `${code}: ${message}`; },
    send: async (batch: AnswerInput[]): Promise<SendResult> => {
      const r = await request(o.bases[turn++ % o.bases.length], 'POST', paths.answers, { answers: batch }, { ...ip, ...auth });
      o.stats.requestMs.push(r.ms);
      o.stats.answerMs.push(r.ms);
      if (r.status === 200) {
        failingSince = 0;
        const reply = r.body as { acknowledged: string[]; conflicts: string[]; answered: number };
        const now = performance.now();
        for (const id of reply.acknowledged) o.stats.ackDelayMs.push(now - (givenAt.get(id) ?? now));
        o.stats.batches++;
        o.stats.answersAcked += reply.acknowledged.length;
        o.stats.conflicts += reply.conflicts.length;
        o.stats.ackedIds.push(...reply.acknowledged);
        acked += reply.acknowledged.length;
        return { ok: true, data: reply };
      }
      o.stats.errors[`answers ${r.status}`] = (o.stats.errors[`answers ${r.status}`] ?? 0) + 1;
      const retry = retryable(r.status);
      if (retry) {
        failingSince ||= Date.now();
        if (Date.now() - failingSince > (o.giveUpMs ?? 120_000)) return { ok: false, retry: false, code: String(r.status), message: 'gave up' };
        o.stats.retries++;
      }
      return { ok: false, retry, code: String(r.status), message: JSON.stringify(r.body) };
    },
  });

  const every = o.answerEveryMs ?? 0;
  const t0 = performance.now() + (o.firstAnswerAfterMs ?? 0);
  let given = 0;
  for (const [k, t] of s.upcoming.entries()) {
    // Open loop: the k-th answer is given at t0 + k·every, however the earlier sends fare.
    const due = t0 + k * every - performance.now();
    if (due > 0) await sleep(due);
    if (o.stopAnswering?.() || stopped) break;
    const answer = t.kind === 'attention' ? Math.max(0, t.attention!.options.indexOf('Often')) : t.idx % 2;
    const a = { clientId: randomUUID(), idx: t.idx, answer, responseMs: 850 };
    givenAt.set(a.clientId, performance.now());
    queue.push(a);
    o.stats.answersGiven++;
    given++;
  }
  if (!(await queue.drain()) || stopped) throw new Error(`answers refused: ${stopped}`);
  if (given < s.upcoming.length) return acked;
  const done = await send(paths.complete, {}, auth, 'complete', o.stats.seatMs);
  if (done.status !== 200) throw new Error(`complete ${done.status}: ${JSON.stringify(done.body)}`);
  o.stats.completes++;
  return acked;
}

/** Runs `n` respondents with at most `concurrency` at once. */
export async function runRespondents(n: number, concurrency: number, make: (i: number) => Promise<unknown>): Promise<{ failures: Error[] }> {
  let next = 0;
  const failures: Error[] = [];
  await Promise.all(Array.from({ length: Math.min(n, concurrency) }, async () => {
    while (next < n) {
      const i = next++;
      try { await make(i); } catch (err) { failures.push(err as Error); }
    }
  }));
  return { failures };
}

export function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return 0;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}
