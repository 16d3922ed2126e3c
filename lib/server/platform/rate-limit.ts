import 'server-only';
import { createHash } from 'node:crypto';
import { headers } from 'next/headers';
import pg from 'pg';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { env } from './env';
import { AppError } from '@/lib/server/http/errors';

// Rate limits shared by every app instance: the counters live in PostgreSQL (table rate_limit,
// created by a migration). The library's upserts go through a small pool of their own with
// synchronous_commit off: a counter lost in a crash costs nothing, and the answer path then
// pays no extra WAL flush per request. `limit(kind, key)` throws a 429 with Retry-After; each
// kind's allowance is in `rules()`, the respondent ones tuned by RATE_LIMIT_RESPONDENT_PER_MIN,
// RATE_LIMIT_ANSWERS_PER_MIN and RATE_LIMIT_ANSWERS_PER_RESPONDENT_PER_MIN (the load bench
// raises them). The client IP is the first X-Forwarded-For hop or X-Real-IP: run behind a proxy
// that sets them. Counters survive in a reused test database, so tests that hit a limit use
// fresh fake IPs and e-mails. Tests: tests/integration/rate-limits.test.ts.

export type LimitKind =
  | 'sign-in-email'
  | 'sign-in-ip'
  | 'sign-up-ip'
  | 'reset-email'
  | 'reset-ip'
  | 'invite-ip'
  | 'respondent-start-ip'
  | 'respondent-start-link-address'
  | 'respondent-ip'
  | 'respondent';

interface Rule {
  points: number;
  seconds: number;
}

function rules(kind: LimitKind): Rule {
  const e = env();
  switch (kind) {
    case 'sign-in-email': return { points: 10, seconds: 300 };
    case 'sign-in-ip': return { points: 100, seconds: 300 };
    case 'sign-up-ip': return { points: 20, seconds: 600 };
    case 'reset-email': return { points: 5, seconds: 600 };
    case 'reset-ip': return { points: 30, seconds: 600 };
    case 'invite-ip': return { points: 30, seconds: 600 };
    case 'respondent-start-ip': return { points: e.RATE_LIMIT_RESPONDENT_PER_MIN, seconds: 60 };
    case 'respondent-start-link-address': return { points: e.RATE_LIMIT_STARTS_PER_LINK_ADDRESS, seconds: 600 };
    case 'respondent-ip': return { points: e.RATE_LIMIT_ANSWERS_PER_MIN, seconds: 60 };
    case 'respondent': return { points: e.RATE_LIMIT_ANSWERS_PER_RESPONDENT_PER_MIN, seconds: 60 };
  }
}

type Holder = { rateLimitPool?: pg.Pool };
const holder = globalThis as unknown as Holder;

function pool(): pg.Pool {
  holder.rateLimitPool ??= new pg.Pool({ connectionString: env().DATABASE_URL, max: 4, options: '-c synchronous_commit=off' });
  return holder.rateLimitPool;
}

const limiters = new Map<string, RateLimiterPostgres>();

function limiter(kind: LimitKind): RateLimiterPostgres {
  const { points, seconds } = rules(kind);
  const id = `${kind}:${points}:${seconds}`;
  let l = limiters.get(id);
  if (!l) {
    l = new RateLimiterPostgres({
      storeClient: pool(),
      storeType: 'pool',
      tableName: 'rate_limit',
      tableCreated: true,
      keyPrefix: kind,
      points,
      duration: seconds,
    });
    limiters.set(id, l);
  }
  return l;
}

const waitText = (s: number) => (s < 90 ? `${s} seconds` : `${Math.ceil(s / 60)} minutes`);

/** Counts one attempt under `key`; over the limit it throws a 429 with Retry-After. */
export async function limit(kind: LimitKind, key: string): Promise<void> {
  // Keys are hashed: e-mail addresses and resume tokens are not stored in the counters table.
  const hashed = createHash('sha256').update(key).digest('base64url').slice(0, 32);
  try {
    await limiter(kind).consume(hashed);
  } catch (err) {
    if (!(err instanceof RateLimiterRes)) throw err;
    const seconds = Math.max(1, Math.ceil(err.msBeforeNext / 1000));
    throw new AppError(429, 'rate_limited', `Too many attempts. Try again in ${waitText(seconds)}.`, undefined, { 'Retry-After': String(seconds) });
  }
}

/**
 * The client's address. Trust assumption: the app runs behind a reverse proxy that sets
 * X-Forwarded-For (its first hop is the client) or X-Real-IP and strips what clients send.
 * Without such a proxy these headers are client-chosen, and the per-IP limits only slow a
 * careless client; the per-account and per-respondent limits still hold.
 */
export function clientIp(h: Headers): string {
  const first = h.get('x-forwarded-for')?.split(',')[0]?.trim();
  return (first || h.get('x-real-ip')?.trim() || 'unknown').slice(0, 64);
}

/** The client's address inside a server action (outside a request, e.g. a script: one shared key). */
export async function actionClientIp(): Promise<string> {
  try {
    return clientIp(await headers());
  } catch {
    return 'unknown';
  }
}
