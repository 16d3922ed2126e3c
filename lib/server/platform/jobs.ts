import 'server-only';
import PgBoss from 'pg-boss';
import { env } from './env';

// The job queue: pg-boss in its own PostgreSQL schema, shared by every app instance and
// worker, so long computations survive restarts (an active job whose worker died expires
// and is retried) and several workers split the work. Queues `analysis` (fits, segment
// comparisons) and `planner`; policy 'short' with the caller's singleton key, so repeated polls
// collapse into one queued job; jobs expire after 15 min and are retried twice. The worker
// (scripts/worker.ts, run beside the app by `npm start` and the test app; RUN_WORKER=0 skips it)
// runs them through ./job-handlers.ts. Queue `mail` (policy 'standard': every message is its
// own job) carries account e-mails sent after the request has answered (enqueueMail).
// Fairness: the queue is shared by every workspace, so each may have at most
// MAX_WAITING_PER_WORKSPACE computations waiting or running at once (lib/server/analysis/cache.ts
// refuses a new one with 429 beyond that); repeats of one computation are one job (the
// singleton key), and the planner takes widths from a fixed set (PLANNER_WIDTHS).

export const QUEUES = ['analysis', 'planner'] as const;
export type QueueName = (typeof QUEUES)[number];

/** Long enough for a 1,000-sample bootstrap or a planner search on a large design. */
const EXPIRE_SECONDS = 15 * 60;
const RETRY_LIMIT = 2;

/** Computations one workspace may have queued or running at once (a results page needs 2–4). */
export const MAX_WAITING_PER_WORKSPACE = 8;
/** A queued or running row older than this no longer counts (its job expired; a poll re-sends it). */
export const WAITING_WINDOW_SECONDS = EXPIRE_SECONDS;

type Holder = { bossPromise?: Promise<PgBoss>; bossRole?: 'sender' | 'worker' };
const holder = globalThis as unknown as Holder;

/**
 * One pg-boss per process. App instances only send (no maintenance loop); the worker process
 * calls it with 'worker' first, which also runs pg-boss's supervision (expiry, retention).
 */
export function boss(role: 'sender' | 'worker' = 'sender'): Promise<PgBoss> {
  if (!holder.bossPromise) {
    holder.bossRole = role;
    holder.bossPromise = (async () => {
      const b = new PgBoss({
        connectionString: env().DATABASE_URL, schema: 'pgboss', max: role === 'worker' ? 4 : 2,
        supervise: role === 'worker', schedule: false, application_name: `notchwise-${role}`,
      });
      b.on('error', (err) => console.error('[jobs]', err));
      await b.start();
      await ensureQueues(b);
      return b;
    })().catch((err) => {
      holder.bossPromise = undefined;
      throw err;
    });
  }
  return holder.bossPromise;
}

export const MAIL_QUEUE = 'mail';

async function ensureQueues(b: PgBoss) {
  for (const name of [...QUEUES, MAIL_QUEUE]) {
    if (await b.getQueue(name)) continue;
    try {
      // 'short': at most one queued job per singleton key, so repeated page polls collapse.
      // Mail is 'standard': a 'short' queue keeps a single job without a singleton key.
      const policy = name === MAIL_QUEUE ? 'standard' : 'short';
      await b.createQueue(name, { name, policy, retryLimit: RETRY_LIMIT, retryDelay: 5, expireInSeconds: EXPIRE_SECONDS });
    } catch (err) {
      // Another process created it in the meantime.
      if (!(await b.getQueue(name))) throw err;
    }
  }
}

/** Queues a job; a job with the same key already waiting makes this a no-op. */
export async function enqueue(queue: QueueName, data: object, singletonKey: string): Promise<void> {
  const b = await boss();
  await b.send(queue, data, { singletonKey, retryLimit: RETRY_LIMIT, retryDelay: 5, expireInSeconds: EXPIRE_SECONDS });
}

/** Queues one e-mail job (retried with a delay when the relay fails; the request answered already). */
export async function enqueueMail(data: { kind: string } & Record<string, unknown>): Promise<void> {
  const b = await boss();
  await b.send(MAIL_QUEUE, data, { retryLimit: 5, retryDelay: 30, retryBackoff: true, expireInSeconds: 120 });
}

export async function stopBoss(): Promise<void> {
  const p = holder.bossPromise;
  holder.bossPromise = undefined;
  if (p) await (await p).stop({ graceful: true, wait: true });
}

export { RETRY_LIMIT };
