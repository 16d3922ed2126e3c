import 'server-only';
import { createHash } from 'node:crypto';
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
// raises them). Addresses come from ./client-address.ts (the socket's, unless TRUSTED_PROXIES
// says otherwise), so a client-chosen X-Forwarded-For cannot spread its attempts over keys.
//
// Sign-in has two limits side by side: per address (every attempt counts), and per account,
// keyed by the e-mail address alone, counting wrong passwords only (`recordFailure`). An
// account over its limit is refused without the password being checked until the window ends
// — or until a password reset, which clears the counter (`clearLimit`) and signs the person
// in. The reset is the path an attacker cannot block: the link goes to the owner's mailbox,
// and even if the attacker spends the reset-request limit, those requests put working links
// in that same mailbox. Counters survive in a reused test database, so tests that hit a limit
// use fresh addresses and e-mails. Tests: tests/integration/rate-limits.test.ts,
// tests/integration/sign-in-limits.test.ts.

export type LimitKind =
  | 'sign-in-account'
  | 'sign-in-ip'
  | 'sign-up-ip'
  | 'reset-email'
  | 'reset-ip'
  | 'invite-ip'
  | 'invite-workspace'
  | 'invite-sender'
  | 'confirm-ip'
  | 'confirm-resend'
  | 'respondent-start-ip'
  | 'respondent-start-link-address'
  | 'respondent-ip'
  | 'respondent';

/** Wrong passwords for one account in 15 minutes before it is refused (until reset or the window ends). */
export const SIGN_IN_ACCOUNT_FAILURES = 10;

interface Rule {
  points: number;
  seconds: number;
}

function rules(kind: LimitKind): Rule {
  const e = env();
  switch (kind) {
    case 'sign-in-account': return { points: SIGN_IN_ACCOUNT_FAILURES, seconds: 900 };
    case 'sign-in-ip': return { points: 100, seconds: 300 };
    case 'sign-up-ip': return { points: 20, seconds: 600 };
    case 'reset-email': return { points: 5, seconds: 600 };
    case 'reset-ip': return { points: 30, seconds: 600 };
    case 'invite-ip': return { points: 30, seconds: 600 };
    case 'invite-workspace': return { points: 50, seconds: 86_400 };
    case 'invite-sender': return { points: 20, seconds: 3600 };
    case 'confirm-ip': return { points: 30, seconds: 600 };
    case 'confirm-resend': return { points: 3, seconds: 3600 };
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

// Keys are hashed: e-mail addresses and resume tokens are not stored in the counters table.
const hashed = (key: string) => createHash('sha256').update(key).digest('base64url').slice(0, 32);

function tooMany(msBeforeNext: number, message?: (wait: string) => string): AppError {
  const seconds = Math.max(1, Math.ceil(msBeforeNext / 1000));
  const text = message ? message(waitText(seconds)) : `Too many attempts. Try again in ${waitText(seconds)}.`;
  return new AppError(429, 'rate_limited', text, undefined, { 'Retry-After': String(seconds) });
}

/** Counts one attempt under `key`; over the limit it throws a 429 with Retry-After. */
export async function limit(kind: LimitKind, key: string, message?: (wait: string) => string): Promise<void> {
  try {
    await limiter(kind).consume(hashed(key));
  } catch (err) {
    if (!(err instanceof RateLimiterRes)) throw err;
    throw tooMany(err.msBeforeNext, message);
  }
}

/** Throws the 429 when `key` has used its allowance, without counting this call. */
export async function assertUnderLimit(kind: LimitKind, key: string, message?: (wait: string) => string): Promise<void> {
  const res = await limiter(kind).get(hashed(key));
  if (res && res.consumedPoints >= rules(kind).points) throw tooMany(res.msBeforeNext, message);
}

/** Counts one failure under `key` (never throws for being over; assertUnderLimit refuses later). */
export async function recordFailure(kind: LimitKind, key: string): Promise<void> {
  await limiter(kind).penalty(hashed(key), 1);
}

/** Forgets `key`'s count (a successful sign-in or a password reset). */
export async function clearLimit(kind: LimitKind, key: string): Promise<void> {
  await limiter(kind).delete(hashed(key));
}

