// Simulated respondents over real HTTP (keep-alive), doing what the respondent page's script
// does: start, answer every trial in order with its own client id, complete; on a network
// error, 5xx or 429 the same request (same client id) is retried with backoff.
import http from 'node:http';
import { randomUUID } from 'node:crypto';

export interface Reply { status: number; body: unknown; ms: number }
export interface ClientStats {
  answerMs: number[];
  answersAcked: number;
  completes: number;
  errors: Record<string, number>;
  retries: number;
}

export const newStats = (): ClientStats => ({ answerMs: [], answersAcked: 0, completes: 0, errors: {}, retries: 0 });

const agent = new http.Agent({ keepAlive: true, maxSockets: 1024 });

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

const retryable = (s: number) => s === 0 || s >= 500 || s === 429;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export interface RespondentOptions {
  /** One base URL, or several: each request goes to the next (two instances behind a balancer). */
  bases: string[];
  linkToken: string;
  stats: ClientStats;
  /** Backoff of the first retry (doubles, capped at maxBackoffMs); the page uses 1 s … 15 s. */
  backoffMs?: number;
  maxBackoffMs?: number;
  /** Give up after this long of failed retries for one request. */
  giveUpMs?: number;
}

interface Trial { idx: number; kind: string; attention?: { options: string[] } }

/** Runs one respondent start to complete; resolves with the number of answers acknowledged. */
export async function runRespondent(o: RespondentOptions): Promise<number> {
  let turn = Math.floor(Math.random() * o.bases.length);
  // Each respondent on its own (benchmarking-range, RFC 2544) address, as the proxy in front would say.
  const ip = { 'x-forwarded-for': `198.18.${Math.floor(Math.random() * 256)}.${Math.floor(Math.random() * 256)}` };
  const send = async (method: string, path: string, body: unknown, headers: Record<string, string>, what: string) => {
    const startedAt = Date.now();
    for (let attempt = 0; ; attempt++) {
      const r = await request(o.bases[turn++ % o.bases.length], method, path, body, { ...ip, ...headers });
      if (!retryable(r.status)) return r;
      o.stats.errors[`${what} ${r.status}`] = (o.stats.errors[`${what} ${r.status}`] ?? 0) + 1;
      if (Date.now() - startedAt > (o.giveUpMs ?? 120_000)) return r;
      o.stats.retries++;
      await sleep(Math.min(o.maxBackoffMs ?? 2000, (o.backoffMs ?? 100) * 2 ** attempt));
    }
  };
  const api = `/api/r/${o.linkToken}`;
  const started = await send('POST', `${api}/start`, { consent: true, segmentAnswers: { household: '2' } }, {}, 'start');
  if (started.status !== 200) throw new Error(`start ${started.status}: ${JSON.stringify(started.body)}`);
  const s = started.body as { resumeToken: string; upcoming: Trial[] };
  const auth = { 'x-resume-token': s.resumeToken };
  let acked = 0;
  for (const t of s.upcoming) {
    const answer = t.kind === 'attention' ? Math.max(0, t.attention!.options.indexOf('Often')) : t.idx % 2;
    const r = await send('POST', `${api}/answer`, { clientId: randomUUID(), idx: t.idx, answer, responseMs: 850 }, auth, 'answer');
    if (r.status !== 200) throw new Error(`answer ${t.idx} ${r.status}: ${JSON.stringify(r.body)}`);
    o.stats.answerMs.push(r.ms);
    o.stats.answersAcked++;
    acked++;
  }
  const done = await send('POST', `${api}/complete`, {}, auth, 'complete');
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
