// The throw-away test environment: its own cluster folder, port and database, never the demo data.
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { ensureCluster, dropDatabase } from './postgres.mjs';
import { DATA, ROOT, RESPONDENT_BUILD_ARGS, intFromEnv } from './project.mjs';
import { run } from './run.mjs';
import { bin, startService, stopService, startMailCatcher, startFakeStripe, waitForPort } from './services.mjs';

export const TEST_PGPORT = intFromEnv('TEST_PGPORT', 54339);
export const TEST_APP_PORT = intFromEnv('TEST_APP_PORT', 3100);
export const TEST_SMTP_PORT = intFromEnv('TEST_SMTP_PORT', 2025);
export const TEST_MAIL_WEB_PORT = intFromEnv('TEST_MAIL_WEB_PORT', 2080);
export const TEST_STRIPE_PORT = intFromEnv('TEST_STRIPE_PORT', 12112);
export const TEST_STRIPE_WEBHOOK_SECRET = 'whsec_test_only_0123456789abcdef';
const TEST_DB = process.env.TEST_DB_NAME ?? 'notchwise_test';
/** Several checkouts or engineers can test side by side with their own ports, database and build folder. */
export const TEST_DIST_DIR = process.env.TEST_DIST_DIR ?? '.next-test';

/** Creates a fresh, migrated test database; returns its URL. */
export async function prepareTestDatabase({ fresh = true } = {}) {
  process.env.PG_FSYNC = 'off'; // a throw-away cluster: durability buys nothing here
  const root = path.join(DATA, 'test');
  await ensureCluster({ root, port: TEST_PGPORT, database: 'postgres' });
  if (fresh) dropDatabase({ port: TEST_PGPORT, database: TEST_DB });
  const url = await ensureCluster({ root, port: TEST_PGPORT, database: TEST_DB });
  const r = run(bin('tsx'), ['scripts/migrate.ts'], { cwd: ROOT, env: { ...process.env, DATABASE_URL: url } });
  if (r.code !== 0) throw new Error('migrations failed on the test database:\n' + r.stderr + r.stdout);
  // The demo accounts and data are loaded into the throw-away database too (e2e tests use them).
  const s = run(bin('tsx'), ['--conditions=react-server', 'scripts/seed.ts'], {
    cwd: ROOT,
    env: { ...process.env, DATABASE_URL: url, AUTH_SECRET: 'seed-only-secret-0123456789abcdefghij', BCRYPT_COST: '4' },
  });
  if (s.code !== 0) throw new Error('seeding the test database failed:\n' + s.stderr + s.stdout);
  return url;
}

export function testEnv(databaseUrl) {
  const appUrl = `http://127.0.0.1:${TEST_APP_PORT}`;
  return {
    DATABASE_URL: databaseUrl,
    AUTH_SECRET: process.env.TEST_AUTH_SECRET ?? randomBytes(32).toString('base64url'),
    APP_URL: appUrl,
    AUTH_URL: appUrl,
    E2E_BASE_URL: appUrl,
    BCRYPT_COST: '4',
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(TEST_SMTP_PORT),
    MAIL_API_URL: `http://127.0.0.1:${TEST_MAIL_WEB_PORT}`,
    STRIPE_SECRET_KEY: 'sk_test_local_fake',
    STRIPE_WEBHOOK_SECRET: TEST_STRIPE_WEBHOOK_SECRET,
    STRIPE_FAKE_URL: `http://127.0.0.1:${TEST_STRIPE_PORT}`,
    NEXT_TELEMETRY_DISABLED: '1',
  };
}

/** Builds the app into .next-test (so a running `npm start` is left alone). */
export function buildTestApp(env) {
  // The respondent pages' own bundle (respondent/vite.config.ts), served by /r-assets/[file].
  const v = run(bin('vite'), [...RESPONDENT_BUILD_ARGS, '--logLevel', 'warn'], { cwd: ROOT, env: { ...process.env, ...env, NODE_ENV: 'production' } });
  if (v.code !== 0) throw new Error('build:respondent failed:\n' + v.stdout.slice(-4000) + v.stderr.slice(-4000));
  const r = run(bin('next'), ['build'], { cwd: ROOT, env: { ...process.env, ...env, NODE_ENV: 'production', NEXT_DIST_DIR: TEST_DIST_DIR } });
  if (r.code !== 0) throw new Error('next build failed:\n' + r.stdout.slice(-4000) + r.stderr.slice(-4000));
}

/** Starts the stand-ins and the built app; resolves when the app answers. */
export async function startTestApp(env) {
  const mail = startMailCatcher({ smtpPort: TEST_SMTP_PORT, webPort: TEST_MAIL_WEB_PORT, quiet: true });
  const stripe = startFakeStripe({ port: TEST_STRIPE_PORT, webhookUrl: `${env.APP_URL}/api/stripe/webhook`, webhookSecret: env.STRIPE_WEBHOOK_SECRET, quiet: true, delayMs: 300 });
  const app = startService('app', bin('next'), ['start', '-H', '127.0.0.1', '-p', String(TEST_APP_PORT)], {
    env: { ...process.env, ...env, NODE_ENV: 'production', NEXT_DIST_DIR: TEST_DIST_DIR },
    quiet: true,
  });
  // The job worker (fits, planner) beside the app, as `npm start` runs it.
  const worker = startService('worker', bin('tsx'), ['--conditions=react-server', 'scripts/worker.ts'], {
    env: { ...process.env, ...env, NODE_ENV: 'production' },
    quiet: true,
  });
  await Promise.all([waitForPort(TEST_APP_PORT, { timeoutMs: 90_000 }), waitForPort(TEST_SMTP_PORT), waitForPort(TEST_MAIL_WEB_PORT), waitForPort(TEST_STRIPE_PORT)]);
  return [mail, stripe, app, worker];
}

export function stopTestApp(children) {
  for (const c of children) stopService(c);
}
