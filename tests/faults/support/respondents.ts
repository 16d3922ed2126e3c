// Shared by the fault tests: the database pool, a crowd of respondents, the exactly-once checks.
import { expect, inject } from 'vitest';
import pg from 'pg';
import { newStats, runRespondent, runRespondents, type ClientStats } from '../../../scripts/load/respondent-client';
import { storedFacts, type LoadStudy } from '../../../scripts/load/study';

export function faultsPool(): pg.Pool {
  const pool = new pg.Pool({ connectionString: inject('faultsEnv').DATABASE_URL, max: 3 });
  pool.on('error', () => {}); // idle clients cut by a restart are dropped; the next query reconnects
  return pool;
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export async function until(cond: () => boolean | Promise<boolean>, timeoutMs = 60_000, what = 'condition'): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!(await cond())) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await sleep(50);
  }
}

/**
 * `n` respondents at once, each giving an answer every 100 ms and sending them with the page's
 * own answer queue (batches of 8, the same client ids on every retry through the fault); the
 * backoff is shorter than the page's (250 ms doubling to 2 s) to keep the run short.
 */
export function crowd(study: LoadStudy, bases: string[], n = 200) {
  const stats: ClientStats = newStats();
  const done = runRespondents(n, n, () => runRespondent({ bases, linkToken: study.linkToken, stats, answerEveryMs: 100, backoffMs: 250, maxBackoffMs: 2000, giveUpMs: 120_000 }));
  return { stats, done };
}

/** Samples the balance while a run goes on; returns the lowest value seen. */
export function watchBalance(pool: pg.Pool, workspaceId: string) {
  let lowest = Infinity;
  let on = true;
  const loop = (async () => {
    while (on) {
      try {
        const r = await pool.query('select coalesce(sum(delta), 0)::int as b from seat_ledger_entry where workspace_id = $1', [workspaceId]);
        lowest = Math.min(lowest, r.rows[0].b);
      } catch {
        // the database is down for a moment: nothing to sample
      }
      await sleep(100);
    }
  })();
  return async () => { on = false; await loop; return lowest; };
}

/**
 * Every acknowledged answer stored exactly once, counters consistent, a seat used per complete
 * and the balance never below zero (also over the ledger's history, entry by entry).
 */
export async function expectNothingLost(pool: pg.Pool, study: LoadStudy, stats: ClientStats, failures: Error[], expected: { respondents: number; trialsEach: number; extraAnswers?: number; extraCompletes?: number }) {
  expect(failures.map((f) => f.message)).toEqual([]);
  expect(stats.completes).toBe(expected.respondents);
  expect(stats.answersGiven).toBe(expected.respondents * expected.trialsEach);
  // Every answer given was acknowledged once (none named a conflict: each phone answers each trial once).
  expect(stats.answersAcked).toBe(stats.answersGiven);
  expect(stats.conflicts).toBe(0);
  expect(stats.batches).toBeLessThan(stats.answersAcked);
  const f = await storedFacts(pool, study);
  expect(f.trials).toBe(stats.answersAcked + (expected.extraAnswers ?? 0));
  expect(f.duplicates).toBe(0);
  expect(f.countMismatches).toBe(0);
  expect(f.completes).toBe(stats.completes + (expected.extraCompletes ?? 0));
  expect(f.seatsUsed).toBe(f.completes);
  expect(f.balance).toBe(study.seats - f.completes);
  const history = await pool.query('select min(s)::int as m from (select sum(delta) over (order by created_at, id) as s from seat_ledger_entry where workspace_id = $1) h', [study.workspaceId]);
  expect(history.rows[0].m).toBeGreaterThanOrEqual(0);
  return f;
}
