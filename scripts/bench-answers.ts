// npm run bench:answers [-- --respondents 200 --port 3901 --instances 1]
// N simulated respondents complete a live study concurrently through the real HTTP routes of
// a production build (`next start`), against a private database; then, in the same run, the
// same number of single-row inserts of the trial row shape go straight through `pg` into a
// scratch copy of the trial table with the same concurrency: the machine's ceiling.
import type { ChildProcess } from 'node:child_process';
import { execFile } from 'node:child_process';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { DATA } from './lib/project.mjs';
import { bin, startFakeStripe, stopService } from './lib/services.mjs';
import { appEnv, ensureBuild, freshDatabase, groupCpuSeconds, startApp, stopApp, WEBHOOK_SECRET } from './load/app';
import { createLoadStudy, storedFacts } from './load/study';
import { newStats, percentile, request, runRespondent, runRespondents } from './load/respondent-client';

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const RESPONDENTS = arg('respondents', 200);
const CONCURRENCY = arg('concurrency', RESPONDENTS);
const PORT = arg('port', Number(process.env.LOAD_APP_PORT ?? 3901));
const PG_PORT = Number(process.env.TEST_PGPORT ?? 54339);
/** Several instances behind a round-robin "balancer": each request goes to the next one. */
const INSTANCES = arg('instances', 1);
const POOL_MAX = Number(process.env.DB_POOL_MAX ?? 10);
const log = (s: string) => process.stdout.write(`[bench:answers] ${s}\n`);

/** Transactions committed in this database so far (every autocommit statement is one). */
async function commits(pool: pg.Pool): Promise<number> {
  await pool.query('select pg_stat_clear_snapshot()');
  return Number((await pool.query('select xact_commit from pg_stat_database where datname = current_database()')).rows[0].xact_commit);
}

async function rawInserts(pool: pg.Pool, rows: number, concurrency: number, studyId: string) {
  await pool.query('drop table if exists trial_bench_scratch');
  await pool.query('create table trial_bench_scratch (like trial including all)');
  const respondents = Array.from({ length: concurrency }, () => randomUUID());
  let next = 0;
  const t = performance.now();
  await Promise.all(respondents.map(async (rid) => {
    for (let idx = 0; next < rows; idx++) {
      next++;
      await pool.query(
        `insert into trial_bench_scratch (study_id, respondent_id, idx, kind, base_price, discount, shown, answer, response_ms, client_id, answered_at)
         values ($1, $2, $3, 'test', 9.99, 0.05, $4::jsonb, 1, 850, $5, now()) on conflict do nothing`,
        [studyId, rid, idx, JSON.stringify({ price: 9.49, lowerSide: 'left', rung: 0.05, viewMs: 300 }), randomUUID()],
      );
    }
  }));
  const s = (performance.now() - t) / 1000;
  await pool.query('drop table trial_bench_scratch');
  return rows / s;
}

/** The framework's own cost: a route that reads no database (`/api/me` signed out → 401), by autocannon. */
async function frameworkFloor(app: ChildProcess, base: string): Promise<string> {
  const cannon = (seconds: number) => new Promise<string>((resolve, reject) =>
    execFile(bin('autocannon'), ['-c', '50', '-d', String(seconds), '-j', `${base}/api/me`], { maxBuffer: 16 * 1024 * 1024 }, (err, out) => (err ? reject(err) : resolve(out))));
  await cannon(2);
  const c0 = groupCpuSeconds(app);
  const j = JSON.parse(await cannon(8)) as { requests: { average: number; total: number }; latency: { p50: number; p99: number }; non2xx: number };
  const cpu = groupCpuSeconds(app) - c0;
  return `framework floor, GET /api/me signed out (no database, autocannon -c 50 -d 8): ${j.requests.average.toFixed(0)} req/s, p50 ${j.latency.p50} ms, p99 ${j.latency.p99} ms, app CPU ${((cpu * 1000) / j.requests.total).toFixed(2)} ms per request`;
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
  try {
    const study = await createLoadStudy(pool, { seats: RESPONDENTS * 2 });
    // Warm-up: compile the routes' code paths and fill the pools before measuring.
    const warm = newStats();
    await runRespondents(Math.min(20, RESPONDENTS), 20, () => runRespondent({ bases, linkToken: study.linkToken, stats: warm }));
    const before = await storedFacts(pool, study);

    const stats = newStats();
    const cpu0 = apps.reduce((a, app) => a + groupCpuSeconds(app), 0);
    const tx0 = await commits(pool);
    const t = performance.now();
    const { failures } = await runRespondents(RESPONDENTS, CONCURRENCY, () => runRespondent({ bases, linkToken: study.linkToken, stats, giveUpMs: 10_000 }));
    const seconds = (performance.now() - t) / 1000;
    const appCpu = apps.reduce((a, app) => a + groupCpuSeconds(app), 0) - cpu0;
    const statements = (await commits(pool)) - tx0;
    const after = await storedFacts(pool, study);

    const answersPerS = stats.answersAcked / seconds;
    const ms = [...stats.answerMs].sort((a, b) => a - b);
    const [p50, p95, p99] = [50, 95, 99].map((p) => percentile(ms, p));
    const errors = Object.values(stats.errors).reduce((a, b) => a + b, 0) + failures.length;
    log(`${INSTANCES} instance(s); ${RESPONDENTS} respondents (${CONCURRENCY} at once), ${stats.answersAcked} answers + ${RESPONDENTS} starts + ${stats.completes} completes in ${seconds.toFixed(2)} s`);
    log(`answer request latency: p50 ${p50.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms, p99 ${p99.toFixed(1)} ms, max ${(ms.at(-1) ?? 0).toFixed(1)} ms`);
    const requests = stats.answersAcked + RESPONDENTS + stats.completes;
    log(`app CPU: ${appCpu.toFixed(1)} s over ${seconds.toFixed(1)} s wall (${(appCpu / seconds * 100).toFixed(0)} % of one core; ${(appCpu * 1000 / requests).toFixed(2)} ms per request); load average ${os.loadavg().map((l) => l.toFixed(1)).join(' ')}`);
    log(`database: ${statements} committed statements/transactions for ${requests} requests (${(statements / requests).toFixed(2)} per request; rate-limit counters included)`);
    log(`errors: ${errors}${errors ? ` ${JSON.stringify(stats.errors)} ${failures.slice(0, 3).map((f) => f.message).join('; ')}` : ''}`);
    const stored = after.trials - before.trials;
    log(`stored: ${stored} trials for ${stats.answersAcked} acknowledged answers, ${after.duplicates} duplicates, seats used ${after.seatsUsed} = completes ${after.completes}, balance ${after.balance}`);
    if (stored !== stats.answersAcked || after.duplicates || after.seatsUsed !== after.completes) throw new Error('stored data does not match the acknowledged answers');

    const raw = await rawInserts(pool, stats.answersAcked, CONCURRENCY, study.studyId);
    log(`raw single-row inserts through pg (pool of ${POOL_MAX}, ${CONCURRENCY} callers): ${raw.toFixed(0)}/s`);
    log(await frameworkFloor(apps[0], base));
    const probe = await request(base, 'GET', '/api/r/not-a-real-link/state');
    if (probe.status !== 404) throw new Error(`the app stopped answering (${probe.status})`);
    process.stdout.write(`bench:answers answers_per_s=${answersPerS.toFixed(0)} p99_ms=${p99.toFixed(1)} raw_inserts_per_s=${raw.toFixed(0)} ratio=${(answersPerS / raw).toFixed(2)}\n`);
  } finally {
    await Promise.all(apps.map((app) => stopApp(app)));
    stopService(stripe);
    await pool.end();
  }
}

main().then(() => process.exit(0), (err: unknown) => {
  process.stderr.write(`[bench:answers] ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
