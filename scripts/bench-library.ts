// `npm run bench:library [-- --studies 200 --runs 10]`: how long the threshold record page
// (/w/[workspace]/record) takes to render with 200 closed studies, each with its cached fit,
// on a production build (`next start`) and a fresh private database. Seeds the demo accounts,
// fills the record (scripts/load/record-studies.ts), signs in over HTTP as the demo owner,
// then times full server renders of the page (one warm-up first) and of the page with a
// comparison and a picked price. Prints each run; the last line is
// `bench:library studies=<n> ms=<median>`. Timings are printed, never asserted; figures taken on
// a machine shared with other work are "under load".
import path from 'node:path';
import { DATA, DEMO_ACCOUNTS, DEMO_PASSWORD, ROOT } from './lib/project.mjs';
import { run } from './lib/run.mjs';
import { bin, startFakeStripe, stopService } from './lib/services.mjs';
import { appEnv, ensureBuild, freshDatabase, startApp, stopApp, WEBHOOK_SECRET } from './load/app';

const argv = process.argv;
const arg = (name: string, fallback: number) => (argv.indexOf(`--${name}`) > 0 ? Number(argv[argv.indexOf(`--${name}`) + 1]) : fallback);
const STUDIES = arg('studies', 200);
const RUNS = arg('runs', 10);
const PORT = arg('port', Number(process.env.LOAD_APP_PORT ?? process.env.TEST_APP_PORT ?? 3911));
const PG_PORT = arg('pg-port', Number(process.env.TEST_PGPORT ?? 54339));
const STRIPE_PORT = arg('stripe-port', Number(process.env.TEST_STRIPE_PORT ?? 3912));
const log = (s: string) => process.stdout.write(`[bench:library] ${s}\n`);
const cookiePair = (c: string) => c.split(';')[0];
const median = (v: number[]) => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)];

async function signIn(base: string): Promise<string> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const jar = csrf.headers.getSetCookie().map(cookiePair).join('; ');
  const res = await fetch(`${base}/api/auth/callback/credentials`, {
    method: 'POST', redirect: 'manual', headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar },
    body: new URLSearchParams({ csrfToken, email: DEMO_ACCOUNTS[0].email, password: DEMO_PASSWORD, callbackUrl: base }),
  });
  const session = res.headers.getSetCookie().find((c) => /authjs\.session-token=/.test(c));
  if (!session) throw new Error(`sign-in failed (${res.status})`);
  return cookiePair(session);
}

async function timePage(url: string, cookie: string): Promise<{ ms: number; bytes: number; status: number; body: string }> {
  const t = performance.now();
  const res = await fetch(url, { headers: { cookie }, redirect: 'manual' });
  const body = await res.text();
  return { ms: performance.now() - t, bytes: body.length, status: res.status, body };
}

async function main() {
  ensureBuild(log);
  const url = await freshDatabase({ root: path.join(DATA, 'test'), port: PG_PORT, database: 'nw_bench_library' });
  const env = appEnv(url, { stripePort: STRIPE_PORT, smtpPort: Number(process.env.TEST_SMTP_PORT ?? 3913) });
  for (const script of [['scripts/seed.ts'], ['scripts/load/record-studies.ts', String(STUDIES)]]) {
    const r = run(bin('tsx'), ['--conditions=react-server', ...script], { cwd: ROOT, env: { ...process.env, ...env } });
    process.stdout.write(r.stdout);
    if (r.code !== 0) throw new Error(`${script[0]} failed:\n${r.stderr}`);
  }
  const stripe = startFakeStripe({ port: STRIPE_PORT, webhookUrl: `http://127.0.0.1:${PORT}/api/stripe/webhook`, webhookSecret: WEBHOOK_SECRET, quiet: true });
  const app = await startApp(env, PORT);
  try {
    const base = `http://127.0.0.1:${PORT}`;
    const cookie = await signIn(base);
    const page = `${base}/w/harbourline/record`;
    const warm = await timePage(page, cookie);
    if (warm.status !== 200) throw new Error(`the record page answered ${warm.status}`);
    const rows = (warm.body.match(/<tr/g) ?? []).length;
    log(`warm-up: ${warm.ms.toFixed(0)} ms, ${(warm.bytes / 1024).toFixed(0)} kB of HTML, ${rows} table rows`);
    const plain: number[] = [];
    for (let i = 0; i < RUNS; i++) {
      const r = await timePage(page, cookie);
      plain.push(r.ms);
      log(`run ${i + 1}: ${r.ms.toFixed(0)} ms`);
    }
    const ids = [...warm.body.matchAll(/studies\/([0-9a-f-]{36})\/results/g)].map((m) => m[1]);
    const compared: number[] = [];
    for (let i = 0; i < Math.min(RUNS, 5); i++) {
      const r = await timePage(`${page}?category=${encodeURIComponent('Kitchen & home')}&price=25&a=${ids[0]}&b=${ids[8]}`, cookie);
      compared.push(r.ms);
    }
    log(`with a category filter, a picked price and a comparison: median ${median(compared).toFixed(0)} ms over ${compared.length} runs`);
    log(`node ${process.version}, ${(await import('node:os')).cpus().length} cores; figures on a shared machine are "under load"`);
    process.stdout.write(`bench:library studies=${STUDIES} ms=${median(plain).toFixed(0)}\n`);
  } finally {
    await stopApp(app);
    stopService(stripe);
  }
}

main().catch((err: unknown) => {
  process.stderr.write(`[bench:library] ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
