// The production build and `next start` instances the load bench and the fault tests run
// against: one build in its own dist dir (LOAD_DIST_DIR, default .next-test-load), reused until
// a source file is newer than it (LOAD_REUSE_BUILD=1 skips that check; LOAD_BUILD=skip, set
// when `npm test` already built, skips building). Each run gets a fresh database; the instances'
// environment raises the respondent rate limits far above a crowd's rate and runs no job worker.
// LOAD_APP_NODE_ARGS passes node flags to the app (e.g. --cpu-prof); LOAD_VERBOSE=1 shows its output.
import type { ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { ensureCluster, dropDatabase } from '../lib/postgres.mjs';
import { ROOT } from '../lib/project.mjs';
import { run } from '../lib/run.mjs';
import { bin, portInUse, startService, stopService, waitForPort } from '../lib/services.mjs';

export const DIST_DIR = process.env.LOAD_DIST_DIR ?? '.next-test-load';
export const WEBHOOK_SECRET = 'whsec_load_faults_0123456789abcdef';
const SOURCES = ['app', 'components', 'lib', 'entities', 'fonts', 'public', 'migrations', 'respondent'];
const SOURCE_FILES = ['next.config.mjs', 'next.config.ts', 'proxy.ts', 'mikro-orm.config.ts', 'package.json', 'tailwind.config.ts', 'postcss.config.mjs'];

function newestMtime(p: string): number {
  if (!existsSync(p)) return 0;
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let m = 0;
  for (const e of readdirSync(p)) m = Math.max(m, newestMtime(path.join(p, e)));
  return m;
}

/** Builds the app into DIST_DIR unless the last build is newer than every source file. */
export function ensureBuild(log: (s: string) => void = () => {}): void {
  const newest = Math.max(...SOURCES.map((d) => newestMtime(path.join(ROOT, d))), ...SOURCE_FILES.map((f) => newestMtime(path.join(ROOT, f))));
  const stamp = path.join(ROOT, DIST_DIR, 'load-build-stamp');
  if (process.env.LOAD_REUSE_BUILD === '1' && existsSync(stamp)) return;
  // `npm test` hands over the build it has just made (and is serving from): never rebuild that one.
  if (process.env.LOAD_BUILD === 'skip') return;
  if (existsSync(stamp) && Number(readFileSync(stamp, 'utf8')) >= newest) return;
  log(`building the app into ${DIST_DIR} (sources changed since the last build)`);
  const t = Date.now();
  const r = run(bin('next'), ['build'], { cwd: ROOT, env: { ...process.env, NODE_ENV: 'production', NEXT_DIST_DIR: DIST_DIR, NEXT_TELEMETRY_DISABLED: '1' }, maxBuffer: 64 * 1024 * 1024 });
  if (r.code !== 0) throw new Error('next build failed:\n' + r.stdout.slice(-4000) + r.stderr.slice(-4000));
  writeFileSync(stamp, String(newest));
  log(`built in ${((Date.now() - t) / 1000).toFixed(0)} s`);
}

/** A fresh, migrated database on a cluster (created and started when needed). */
export async function freshDatabase(opts: { root: string; port: number; database: string; fsync?: boolean }): Promise<string> {
  process.env.PG_FSYNC = opts.fsync ? 'on' : 'off';
  await ensureCluster({ root: opts.root, port: opts.port, database: 'postgres' });
  dropDatabase({ port: opts.port, database: opts.database });
  const url = await ensureCluster(opts);
  const r = run(bin('tsx'), ['scripts/migrate.ts'], { cwd: ROOT, env: { ...process.env, DATABASE_URL: url } });
  if (r.code !== 0) throw new Error('migrations failed:\n' + r.stderr + r.stdout);
  return url;
}

/** The environment of every instance: the same AUTH_SECRET, so sessions work on any of them. */
export function appEnv(databaseUrl: string, opts: { stripePort: number; smtpPort: number; extra?: Record<string, string> }): Record<string, string> {
  return {
    DATABASE_URL: databaseUrl,
    AUTH_SECRET: randomBytes(32).toString('base64url'),
    BCRYPT_COST: '4',
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(opts.smtpPort),
    STRIPE_SECRET_KEY: 'sk_test_local_fake',
    STRIPE_WEBHOOK_SECRET: WEBHOOK_SECRET,
    STRIPE_FAKE_URL: `http://127.0.0.1:${opts.stripePort}`,
    // Hundreds of simulated respondents come from this one machine: limits raised well above
    // the load (each respondent also sends its own X-Forwarded-For, as behind a proxy).
    RATE_LIMIT_RESPONDENT_PER_MIN: '1000000',
    RATE_LIMIT_STARTS_PER_LINK_ADDRESS: '1000000',
    RATE_LIMIT_ANSWERS_PER_MIN: '10000000',
    RATE_LIMIT_ANSWERS_PER_RESPONDENT_PER_MIN: '100000',
    RUN_WORKER: 'false',
    NEXT_TELEMETRY_DISABLED: '1',
    ...opts.extra,
  };
}

/** `next start` on a port; resolves once it answers HTTP. */
export async function startApp(env: Record<string, string>, port: number, name = `app:${port}`): Promise<ChildProcess> {
  if (await portInUse(port)) throw new Error(`port ${port} is already in use`);
  const appUrl = `http://127.0.0.1:${port}`;
  // LOAD_APP_NODE_ARGS (e.g. "--cpu-prof --cpu-prof-dir=/tmp/prof") profiles the app only.
  const nodeArgs = (process.env.LOAD_APP_NODE_ARGS ?? '').split(' ').filter(Boolean);
  const child = startService(name, process.execPath, [...nodeArgs, path.join(ROOT, 'node_modules/next/dist/bin/next'), 'start', '-H', '127.0.0.1', '-p', String(port)], {
    env: { ...process.env, ...env, APP_URL: appUrl, AUTH_URL: appUrl, NODE_ENV: 'production', NEXT_DIST_DIR: DIST_DIR },
    quiet: process.env.LOAD_VERBOSE !== '1',
  });
  const exited = new Promise<never>((_, reject) => child.once('exit', (code) => reject(new Error(`${name} exited (${code}) before it answered`))));
  await Promise.race([waitForPort(port, { timeoutMs: 90_000 }), exited]);
  await waitHttp(appUrl);
  return child;
}

export async function waitHttp(base: string, timeoutMs = 60_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    try {
      const r = await fetch(`${base}/r/not-a-real-link/state`);
      await r.arrayBuffer();
      if (r.status < 500) return;
    } catch {
      // not up yet
    }
    if (Date.now() > until) throw new Error(`${base} did not answer within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** CPU seconds (user + system) used so far by every process in the instance's process group. */
export function groupCpuSeconds(child: ChildProcess): number {
  let ticks = 0;
  for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
    try {
      // Fields after the ")" of the command name: state ppid pgrp ... utime(12) stime(13).
      const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
      if (Number(f[2]) === child.pid) ticks += Number(f[11]) + Number(f[12]);
    } catch {
      // the process ended meanwhile
    }
  }
  return ticks / 100; // USER_HZ
}

/** Stops an instance and its next-server child (its process group). */
export function stopApp(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    child.once('exit', () => resolve());
    stopService(child, signal);
  });
}
