import 'server-only';
// Rate limits of the answer batch route, counted in this process's memory rather than in the
// shared rate_limit table that starts, sign-ins and the other respondent calls use.
//
// Why: answers are the one request a crowd of phones sends all the time (2,000 shoppers send
// about 500 batches a second). The table-backed limits cost two extra upserts per request, which
// tripled the statements of the answer path and was a large part of its CPU on both sides of
// the connection, to guard a request that is bounded anyway: at most 32 answers, one statement,
// idempotent, and a respondent can never store more rows than the plan has trials. Counted per
// process, the limits still stop one address or one respondent from flooding an instance; behind
// a balancer with N instances the effective limit is N times the configured one, which is
// acceptable here (and only here). Limits count answers, not requests, as their settings say:
// RATE_LIMIT_ANSWERS_PER_MIN per address, RATE_LIMIT_ANSWERS_PER_RESPONDENT_PER_MIN per respondent.
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { env } from '@/lib/server/platform/env';
import { AppError } from '@/lib/server/http/errors';

type Limits = { ip: RateLimiterMemory; respondent: RateLimiterMemory };
type Holder = { __answerLimits?: Map<string, Limits> };
const holder = globalThis as unknown as Holder;

/** One pair of counters per process (and per setting, so a changed setting starts afresh). */
function limiters(): Limits {
  const e = env();
  const id = `${e.RATE_LIMIT_ANSWERS_PER_MIN}:${e.RATE_LIMIT_ANSWERS_PER_RESPONDENT_PER_MIN}`;
  const all = (holder.__answerLimits ??= new Map());
  let l = all.get(id);
  if (!l) {
    l = {
      ip: new RateLimiterMemory({ keyPrefix: 'answers-ip', points: e.RATE_LIMIT_ANSWERS_PER_MIN, duration: 60 }),
      respondent: new RateLimiterMemory({ keyPrefix: 'answers-respondent', points: e.RATE_LIMIT_ANSWERS_PER_RESPONDENT_PER_MIN, duration: 60 }),
    };
    all.set(id, l);
  }
  return l;
}

async function consume(limiter: RateLimiterMemory, key: string, answers: number): Promise<void> {
  try {
    await limiter.consume(key, answers);
  } catch (err) {
    if (!(err instanceof RateLimiterRes)) throw err;
    const seconds = Math.max(1, Math.ceil(err.msBeforeNext / 1000));
    throw new AppError(429, 'rate_limited', `Too many answers at once. Try again in ${seconds} seconds.`, undefined, { 'Retry-After': String(seconds) });
  }
}

/** Counts a batch's answers against the sending address; over the limit a 429 with Retry-After. */
export const limitAnswersFromIp = (ip: string, answers: number) => consume(limiters().ip, ip, answers);

/** Counts a batch's answers against the respondent (by id, so no token is kept in memory). */
export const limitAnswersOfRespondent = (respondentId: string, answers: number) => consume(limiters().respondent, respondentId, answers);
