// `npm start`: everything needed to run Notchwise with its demo data on this machine.
import { ensureDeps } from './lib/deps.mjs';
import { ensureCluster } from './lib/postgres.mjs';
import { ROOT, DATA, intFromEnv, persistentSecret, DEMO_ACCOUNTS, DEMO_PASSWORD, RESPONDENT_BUILD_ARGS } from './lib/project.mjs';
import { log, fail, runLive } from './lib/run.mjs';
import { startService, startMailCatcher, startFakeStripe, stopAll, waitForPort, bin, portInUse } from './lib/services.mjs';
import path from 'node:path';

const t0 = Date.now();
const PORT = intFromEnv('PORT', 3000);
const PGPORT = intFromEnv('PGPORT', 54329);
const SMTP_PORT = intFromEnv('SMTP_PORT', 1025);
const MAIL_WEB_PORT = intFromEnv('MAIL_WEB_PORT', 1080);
const STRIPE_FAKE_PORT = intFromEnv('STRIPE_FAKE_PORT', 12111);
// Real Stripe keys in the environment (and no STRIPE_FAKE_URL) switch the stand-in off.
const useFakeStripe = !!process.env.STRIPE_FAKE_URL || !process.env.STRIPE_SECRET_KEY?.startsWith('sk_');
const STRIPE_FAKE_URL = process.env.STRIPE_FAKE_URL ?? `http://127.0.0.1:${STRIPE_FAKE_PORT}`;

for (const [name, port] of [['PORT', PORT], ['SMTP_PORT', SMTP_PORT], ['MAIL_WEB_PORT', MAIL_WEB_PORT]]) {
  if (await portInUse(port)) fail(`Port ${port} on 127.0.0.1 is already in use (is Notchwise already running?).`, `Stop that program, or choose another port with ${name}=... .`);
}

await ensureDeps(ROOT);
const DATABASE_URL = process.env.DATABASE_URL ?? (await ensureCluster({ root: path.join(DATA, 'dev'), port: PGPORT, database: 'notchwise' }));
const appUrl = process.env.APP_URL ?? `http://127.0.0.1:${PORT}`;
const env = {
  ...process.env,
  NODE_ENV: 'production',
  DATABASE_URL,
  AUTH_SECRET: process.env.AUTH_SECRET ?? persistentSecret('auth-secret'),
  AUTH_URL: appUrl,
  APP_URL: appUrl,
  SMTP_HOST: '127.0.0.1',
  SMTP_PORT: String(SMTP_PORT),
  PORT: String(PORT),
  ...(useFakeStripe ? { STRIPE_FAKE_URL, STRIPE_SECRET_KEY: 'sk_test_local_fake', STRIPE_WEBHOOK_SECRET: process.env.STRIPE_WEBHOOK_SECRET ?? persistentSecret('stripe-webhook-secret') } : {}),
};

const tsx = bin('tsx');
if ((await runLive(tsx, ['scripts/migrate.ts'], { cwd: ROOT, env })) !== 0) fail('Could not apply the migrations.', 'See the message above.');
if ((await runLive(tsx, ['--conditions=react-server', 'scripts/seed.ts'], { cwd: ROOT, env })) !== 0) fail('Could not load the demo data.', 'See the message above.');

log('building the respondent bundle (vite) ...');
if ((await runLive(bin('vite'), RESPONDENT_BUILD_ARGS, { cwd: ROOT, env })) !== 0) fail('The respondent bundle did not build.', 'See the messages above.');
log('building the app (next build) ...');
if ((await runLive(bin('next'), ['build'], { cwd: ROOT, env })) !== 0) fail('The build failed.', 'See the messages above.');

startMailCatcher({ smtpPort: SMTP_PORT, webPort: MAIL_WEB_PORT });
if (useFakeStripe) startFakeStripe({ port: Number(new URL(STRIPE_FAKE_URL).port), webhookUrl: `${appUrl}/api/stripe/webhook`, webhookSecret: env.STRIPE_WEBHOOK_SECRET });
const app = startService('app', bin('next'), ['start', '-H', '127.0.0.1', '-p', String(PORT)], { env });
// The job worker (fits, segment comparisons, planner) runs beside the app; RUN_WORKER=0 leaves the queue to workers elsewhere.
if (!['0', 'false', 'no', 'off'].includes(String(process.env.RUN_WORKER ?? '').toLowerCase())) startService('worker', tsx, ['--conditions=react-server', 'scripts/worker.ts'], { env });
app.on('exit', (code) => {
  if (code) log(`the app stopped (exit code ${code}).`);
  stopAll();
  process.exit(code ?? 0);
});

await waitForPort(PORT, { timeoutMs: 120_000 }).catch((e) => fail(e.message));
const width = Math.max(...DEMO_ACCOUNTS.map((a) => a.email.length));
process.stdout.write(`
Notchwise is running (ready in ${((Date.now() - t0) / 1000).toFixed(1)} s)
  app          ${appUrl}
  mail inbox   http://127.0.0.1:${MAIL_WEB_PORT}  (SMTP on 127.0.0.1:${SMTP_PORT})
  payments     ${useFakeStripe ? `${STRIPE_FAKE_URL}  (local Stripe stand-in: test checkout page, signed webhooks)` : 'Stripe (real keys from the environment)'}
  database     ${DATABASE_URL}  (stop it with: npm run stop)

Demo sign-ins (password for all: ${DEMO_PASSWORD})
${DEMO_ACCOUNTS.map((a) => `  ${a.email.padEnd(width)}  ${a.role}`).join('\n')}

Press Ctrl-C to stop the app.
`);

for (const sig of ['SIGINT', 'SIGTERM']) {
  process.on(sig, () => {
    log('stopping the app (the database keeps running; `npm run stop` stops it)');
    stopAll();
    setTimeout(() => process.exit(0), 500);
  });
}
