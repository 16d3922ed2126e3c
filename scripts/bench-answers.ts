// npm run bench:answers [-- --steps 250,500,1000 --step-seconds 30 --arrivals-per-s 25 --every-ms 2000 --repetitions 3 --instances 1 --port 3901
//                          --batch-answers 4 --batch-wait-ms 3000 --batch-clock latest-answer|oldest-answer]
// Measures shoppers, not a flood: simulated respondents, each giving one answer every 2 s on
// schedule (open loop: the next answer comes whether or not earlier requests have returned),
// sent the way the phone sends them (its own answer queue: 8 answers, or 3 s after the latest,
// one request at a time), against a production build (`next start`) and a private database.
// The number held is ramped in steps; a respondent who reaches the end completes and a new one
// starts, so each step holds its number. After each step the database is checked: every
// acknowledged answer stored, none twice, every counter equal to its rows. The ramp stops at
// the first step whose p99 of respondent requests passes 150 ms. In the same run: the raw
// insert ceiling of the machine (single-row and 4-row inserts of the trial row shape straight
// through `pg`) and the framework floor (a route that touches no database, by autocannon).
// Timings are printed, never asserted.
import type { ChildProcess } from 'node:child_process';
import { execFile } from 'node:child_process';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { trialsPerRespondent } from '../lib/schemas/study.schema';
import { DATA } from './lib/project.mjs';
import { bin, startFakeStripe, stopService } from './lib/services.mjs';
import { appEnv, ensureBuild, freshDatabase, groupCpuSeconds, startApp, stopApp, WEBHOOK_SECRET } from './load/app';
import { createLoadStudy, loadDesign, storedFacts, type LoadStudy } from './load/study';
import { newStats, percentile, request, runRespondent, runRespondents, type ClientStats } from './load/respondent-client';
import { BATCH_ANSWERS as BATCH_ANSWERS_DEFAULT, BATCH_WAIT_MS as BATCH_WAIT_MS_DEFAULT } from '../respondent/client/answer-queue';

const argv = process.argv;
const arg = (name: string, fallback: number) => {
  const i = argv.indexOf(`--${name}`);
  return i > 0 ? Number(argv[i + 1]) : fallback;
};
const stepsArg = argv.indexOf('--steps') > 0 ? argv[argv.indexOf('--steps') + 1] : '250,500,750,1000,1250,1500,1750,2000,2250,2500,3000';
const STEPS = stepsArg.split(',').map(Number).filter((n) => n > 0);
const STEP_SECONDS = arg('step-seconds', 30);
/**
 * New respondents of a step arrive at this rate (a panel blast is not one instant). Every start
 * takes the workspace's seat lock, and a start waiting for it holds a pooled connection: a burst
 * of starts far above what that lock passes would measure the start path, not the shoppers held.
 */
const ARRIVALS_PER_S = arg('arrivals-per-s', 25);
const EVERY_MS = arg('every-ms', 2000);
/** Study length: 3 base prices × 4 rungs × repetitions, plus catch, practice and attention trials (3 → 48 trials). */
const REPETITIONS = arg('repetitions', 3);
/** The phone's batch rule is 8 answers, or 3 s after the latest; these show what another rule would do. */
const BATCH_ANSWERS = arg('batch-answers', BATCH_ANSWERS_DEFAULT);
const BATCH_WAIT_MS = arg('batch-wait-ms', BATCH_WAIT_MS_DEFAULT);
/** `--batch-clock oldest-answer`: the wait counts from the oldest unsent answer (a hard cap on its age). */
const BATCH_CLOCK = argv.includes('--batch-clock') && argv[argv.indexOf('--batch-clock') + 1] === 'oldest-answer' ? 'oldest-answer' : 'latest-answer';
const P99_LIMIT_MS = arg('p99-limit', 150);
const PORT = arg('port', Number(process.env.LOAD_APP_PORT ?? 3901));
const PG_PORT = Number(process.env.TEST_PGPORT ?? 54339);
/** Several instances behind a round-robin "balancer": each request goes to the next one. */
const INSTANCES = arg('instances', 1);
const POOL_MAX = Number(process.env.DB_POOL_MAX ?? 10);
const log = (s: string) => process.stdout.write(`[bench:answers] ${s}\n`);
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Transactions committed in this database so far (every autocommit statement is one). */
async function commits(pool: pg.Pool): Promise<number> {
  await pool.query('select pg_stat_clear_snapshot()');
  return Number((await pool.query('select xact_commit from pg_stat_database where datname = current_database()')).rows[0].xact_commit);
}

/** `rows` inserts of the trial row shape into a scratch copy (same indexes), `perStatement` rows each. */
async function rawInserts(pool: pg.Pool, rows: number, callers: number, studyId: string, perStatement: number) {
  await pool.query('drop table if exists trial_bench_scratch');
  await pool.query('create table trial_bench_scratch (like trial including all)');
  const shown = JSON.stringify({ price: 9.49, lowerSide: 'left', rung: 0.05, viewMs: 300 });
  let next = 0;
  const t = performance.now();
  await Promise.all(Array.from({ length: callers }, async () => {
    const rid = randomUUID();
    for (let idx = 0; next < rows; idx += perStatement) {
      next += perStatement;
      const values: string[] = [];
      const params: unknown[] = [studyId, rid, shown];
      for (let k = 0; k < perStatement; k++) {
        params.push(idx + k, randomUUID());
        values.push(`($1, $2, $${params.length - 1}, 'test', 9.99, 0.05, $3::jsonb, 1, 850, $${params.length}, now())`);
      }
      await pool.query(`insert into trial_bench_scratch (study_id, respondent_id, idx, kind, base_price, discount, shown, answer, response_ms, client_id, answered_at)
         values ${values.join(', ')} on conflict do nothing`, params);
    }
  }));
  const s = (performance.now() - t) / 1000;
  await pool.query('drop table trial_bench_scratch');
  return next / s;
}

/** The framework's own cost: a route that reads no database (`/api/me` signed out → 401), by autocannon. */
async function frameworkFloor(app: ChildProcess, base: string): Promise<{ rps: number; text: string }> {
  const cannon = (seconds: number) => new Promise<string>((resolve, reject) =>
    execFile(bin('autocannon'), ['-c', '50', '-d', String(seconds), '-j', `${base}/api/me`], { maxBuffer: 16 * 1024 * 1024 }, (err, out) => (err ? reject(err) : resolve(out))));
  await cannon(2);
  const c0 = groupCpuSeconds(app);
  const j = JSON.parse(await cannon(8)) as { requests: { average: number; total: number }; latency: { p50: number; p99: number }; non2xx: number };
  const cpu = groupCpuSeconds(app) - c0;
  return {
    rps: j.requests.average,
    text: `framework floor, GET /api/me signed out (no database, autocannon -c 50 -d 8): ${j.requests.average.toFixed(0)} req/s, p50 ${j.latency.p50} ms, p99 ${j.latency.p99} ms, app CPU ${((cpu * 1000) / j.requests.total).toFixed(2)} ms per request`,
  };
}

/** Samples pg_stat_activity every 100 ms: how often and how many of the app's connections wait on a lock. */
function sampleLockWaits(pool: pg.Pool) {
  let on = true;
  let samples = 0;
  let busy = 0;
  let max = 0;
  const loop = (async () => {
    while (on) {
      const r = await pool.query(`select count(*)::int as n from pg_stat_activity where datname = current_database() and wait_event_type = 'Lock'`).catch(() => null);
      if (r) {
        samples++;
        if (r.rows[0].n > 0) busy++;
        max = Math.max(max, r.rows[0].n);
      }
      await sleep(100);
    }
  })();
  return { stop: async () => { on = false; await loop; return { busy: samples ? Math.round((busy / samples) * 100) : 0, max }; } };
}

interface StepResult { respondents: number; answersPerS: number; requestsPerS: number; p99: number; lost: number; duplicated: number; failures: number }

/** Every answer acknowledged since the last check is stored; no trial stored twice; counters equal rows. */
async function verifyStep(pool: pg.Pool, study: LoadStudy, stats: ClientStats) {
  const ids = stats.ackedIds.splice(0);
  let found = 0;
  for (let i = 0; i < ids.length; i += 20_000) {
    const r = await pool.query('select count(*)::int as n from trial where study_id = $1 and client_id = any($2::uuid[])', [study.studyId, ids.slice(i, i + 20_000)]);
    found += r.rows[0].n;
  }
  const f = await storedFacts(pool, study);
  return { lost: ids.length - found, duplicated: f.duplicates, countMismatches: f.countMismatches };
}

async function main() {
  ensureBuild(log);
  const url = await freshDatabase({ root: path.join(DATA, 'test'), port: PG_PORT, database: process.env.LOAD_DB_NAME ?? 'nw_load' });
  const pool = new pg.Pool({ connectionString: url, max: POOL_MAX });
  const stripePort = Number(process.env.TEST_STRIPE_PORT ?? 3905);
  const env = appEnv(url, { stripePort, smtpPort: Number(process.env.TEST_SMTP_PORT ?? 3903) });
  const stripe = startFakeStripe({ port: stripePort, webhookUrl: `http://127.0.0.1:${PORT}/api/stripe/webhook`, webhookSecret: WEBHOOK_SECRET, quiet: true });
  const apps = await Promise.all(Array.from({ length: INSTANCES }, (_, i) => startApp(env, PORT + i)));
  const bases = apps.map((_, i) => `http://127.0.0.1:${PORT + i}`);
  const base = bases[0];
  const failures: Error[] = [];
  let stopping = false;
  const slots: Promise<void>[] = [];
  try {
    const study = await createLoadStudy(pool, { seats: 1_000_000, design: loadDesign(REPETITIONS) });
    log(`phone batch rule: ${BATCH_ANSWERS} answers or ${BATCH_WAIT_MS} ms after the ${BATCH_CLOCK === 'latest-answer' ? 'latest' : 'oldest unsent'} answer; one answer every ${EVERY_MS} ms per respondent; ${trialsPerRespondent(loadDesign(REPETITIONS)).total} trials per respondent (a new one starts when one completes); new respondents arrive at ${ARRIVALS_PER_S}/s; steps measured for ${STEP_SECONDS} s`);
    log(`machine: ${os.cpus().length} cores, load average ${os.loadavg().map((l) => l.toFixed(1)).join(' ')} before the run (other work on it moves every figure)`);
    // Warm-up: compile the routes' code paths and fill the pools before measuring.
    const warm = newStats();
    await runRespondents(20, 20, () => runRespondent({ bases, linkToken: study.linkToken, stats: warm, answerEveryMs: 20 }));
    const warmFacts = await storedFacts(pool, study);

    const stats = newStats();
    // One slot holds one respondent at a time: when one completes, the next starts in its place.
    let slotsStarted = 0;
    const addSlot = (delayMs: number) => slots.push((async () => {
      await sleep(delayMs);
      let first = true;
      while (!stopping) {
        try {
          await runRespondent({
            bases, linkToken: study.linkToken, stats, answerEveryMs: EVERY_MS, firstAnswerAfterMs: EVERY_MS, backoffMs: 1000, maxBackoffMs: 15_000, giveUpMs: 60_000,
            batchAnswers: BATCH_ANSWERS, batchWaitMs: BATCH_WAIT_MS, batchClock: BATCH_CLOCK, stopAnswering: () => stopping,
            onStarted: () => { if (first) { first = false; slotsStarted++; } },
          });
        } catch (err) {
          failures.push(err as Error);
          await sleep(1000);
        }
      }
    })());

    const results: StepResult[] = [];
    let held = 0;
    for (const n of STEPS) {
      const adding = n - held;
      const arrivalSeconds = adding / ARRIVALS_PER_S;
      for (let i = 0; i < adding; i++) addSlot((i / ARRIVALS_PER_S) * 1000);
      held = n;
      // Measure once the new respondents have arrived (their starts returned) and settled into their rhythm.
      const arrivedBy = Date.now() + (arrivalSeconds + 60) * 1000;
      await sleep(arrivalSeconds * 1000);
      while (slotsStarted < n && Date.now() < arrivedBy) await sleep(250);
      await sleep(EVERY_MS * 2);
      stats.requestMs = [];
      stats.answerMs = [];
      stats.seatMs = [];
      stats.ackDelayMs = [];
      const before = { acked: stats.answersAcked, batches: stats.batches, starts: stats.starts, completes: stats.completes, errors: { ...stats.errors }, failures: failures.length };
      const cpu0 = apps.reduce((a, app) => a + groupCpuSeconds(app), 0);
      const client0 = process.cpuUsage();
      const tx0 = await commits(pool);
      const t = performance.now();
      const waits = sampleLockWaits(pool);
      await sleep(STEP_SECONDS * 1000);
      const lockWaits = await waits.stop();
      const seconds = (performance.now() - t) / 1000;
      const appCpu = apps.reduce((a, app) => a + groupCpuSeconds(app), 0) - cpu0;
      const client = process.cpuUsage(client0);
      const clientCpu = (client.user + client.system) / 1e6;
      const statements = (await commits(pool)) - tx0;
      const ms = [...stats.requestMs].sort((a, b) => a - b);
      const answerMs = [...stats.answerMs].sort((a, b) => a - b);
      const seatMs = [...stats.seatMs].sort((a, b) => a - b);
      const delays = [...stats.ackDelayMs].sort((a, b) => a - b);
      const requests = ms.length;
      const [p50, p95, p99] = [50, 95, 99].map((p) => percentile(ms, p));
      const acked = stats.answersAcked - before.acked;
      const batches = stats.batches - before.batches;
      const errors = Object.entries(stats.errors).map(([k, v]) => [k, v - (before.errors[k] ?? 0)] as const).filter(([, v]) => v > 0);
      const v = await verifyStep(pool, study, stats);
      const r: StepResult = { respondents: n, answersPerS: acked / seconds, requestsPerS: requests / seconds, p99, lost: v.lost + v.countMismatches, duplicated: v.duplicated, failures: failures.length - before.failures };
      results.push(r);
      log(`step ${n} respondents: ${r.requestsPerS.toFixed(0)} requests/s (${(batches / seconds).toFixed(0)} answer batches/s of ${(acked / Math.max(1, batches)).toFixed(2)} answers, ${((stats.starts - before.starts) / seconds).toFixed(1)} starts/s, ${((stats.completes - before.completes) / seconds).toFixed(1)} completes/s), ${r.answersPerS.toFixed(0)} answers/s`);
      log(`  respondent requests: p50 ${p50.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms, p99 ${p99.toFixed(1)} ms, max ${(ms.at(-1) ?? 0).toFixed(1)} ms (answer batches p99 ${percentile(answerMs, 99).toFixed(1)} ms${seatMs.length ? `, starts and completes p99 ${percentile(seatMs, 99).toFixed(1)} ms` : ''}); answer given → acknowledged p50 ${(percentile(delays, 50) / 1000).toFixed(2)} s, p99 ${(percentile(delays, 99) / 1000).toFixed(2)} s`);
      log(`  app CPU ${(appCpu / seconds * 100).toFixed(0)} % of one core (${(appCpu * 1000 / Math.max(1, requests)).toFixed(2)} ms per request); database ${(statements / Math.max(1, requests)).toFixed(2)} committed statements per request (rate-limit counters included); this load client ${(clientCpu / seconds * 100).toFixed(0)} % of one core; load average ${os.loadavg().map((l) => l.toFixed(1)).join(' ')}`);
      log(`  connections waiting on a lock: ${lockWaits.busy} % of samples, at most ${lockWaits.max} at once (starts and completes queue on the workspace's seat lock, each holding a pooled connection)`);
      log(`  checked in the database: ${v.lost} acknowledged answers missing, ${v.duplicated} trials stored twice, ${v.countMismatches} counters off; ${errors.length ? errors.map(([k, v]) => `${v} × ${k}`).join(', ') : 'no'} failed requests (retried), ${r.failures} respondents given up`);
      if (p99 > P99_LIMIT_MS) { log(`  p99 passed ${P99_LIMIT_MS} ms: the ramp stops here`); break; }
    }

    // Stop: no new answers; what each phone holds is sent; unfinished respondents stay unfinished.
    stopping = true;
    await Promise.all(slots);
    const f = await storedFacts(pool, study);
    const stored = f.trials - warmFacts.trials;
    log(`run total: ${stats.answersGiven} answers given, ${stats.answersAcked} acknowledged, ${stored} stored, ${f.duplicates} duplicates, ${f.countMismatches} counters off, ${stats.conflicts} conflicts; ${stats.completes} completes, seats used ${f.seatsUsed} = completes ${f.completes}; ${failures.length} respondents given up${failures.length ? ` (${failures.slice(0, 3).map((e) => e.message).join('; ')})` : ''}`);
    // A respondent given up (its phone stopped retrying past an overloaded step) may leave answers the
    // server stored but never acknowledged: counted and shown, not an error. What must never happen is
    // an acknowledged answer missing, a trial stored twice, a counter off or a seat without a complete.
    if (stored > stats.answersAcked) log(`  ${stored - stats.answersAcked} answers stored whose reply never reached a phone that had given up (stored once, not lost)`);
    const unsent = failures.length ? 0 : stats.answersGiven - stats.answersAcked;
    if (stored < stats.answersAcked || unsent !== 0 || f.duplicates || f.countMismatches || f.seatsUsed !== f.completes) throw new Error('stored data does not match the answers given and acknowledged');

    const ok = results.filter((r) => r.p99 <= P99_LIMIT_MS && r.lost === 0 && r.duplicated === 0 && r.failures === 0);
    const best = ok.at(-1);
    const rows = Math.min(40_000, Math.max(10_000, stats.answersAcked));
    const raw = await rawInserts(pool, rows, 200, study.studyId, 1);
    const raw4 = await rawInserts(pool, rows, 200, study.studyId, 4);
    log(`raw inserts through pg (pool of ${POOL_MAX}, 200 callers, ${rows} rows): ${raw.toFixed(0)} rows/s one row per statement, ${raw4.toFixed(0)} rows/s four rows per statement`);
    const floor = await frameworkFloor(apps[0], base);
    log(floor.text);
    const probe = await request(base, 'GET', '/r/not-a-real-link/state');
    if (probe.status !== 404) throw new Error(`the app stopped answering (${probe.status})`);
    process.stdout.write(`bench:answers respondents_held=${best?.respondents ?? 0} answers_per_s=${(best?.answersPerS ?? 0).toFixed(0)} p99_ms=${(best?.p99 ?? 0).toFixed(1)} framework_floor_rps=${floor.rps.toFixed(0)} raw_inserts_per_s=${raw.toFixed(0)} ratio=${((best?.answersPerS ?? 0) / raw).toFixed(2)}\n`);
  } finally {
    stopping = true;
    await Promise.race([Promise.all(slots), sleep(30_000)]);
    await Promise.all(apps.map((app) => stopApp(app)));
    stopService(stripe);
    await pool.end();
  }
}

main().then(() => process.exit(0), (err: unknown) => {
  process.stderr.write(`[bench:answers] ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
