// `npm test`: every tier (typecheck, lint, unit, integration, end-to-end) on a throw-away
// database. The last line is the plain total: `N passed, N failed, N skipped`.
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { ensureDeps } from './lib/deps.mjs';
import { ensureChromiumInstalled } from './lib/system-packages.mjs';
import { ROOT } from './lib/project.mjs';
import { log, runLive } from './lib/run.mjs';
import { bin, stopAll } from './lib/services.mjs';
import { prepareTestDatabase, testEnv, buildTestApp, startTestApp, TEST_DIST_DIR } from './lib/test-env.mjs';

const t0 = Date.now();
const OUT = path.join(ROOT, '.test-output');
rmSync(OUT, { recursive: true, force: true });
mkdirSync(OUT, { recursive: true });
const totals = { passed: 0, failed: 0, skipped: 0 };
const steps = [];

async function step(name, fn) {
  const t = Date.now();
  log(`── ${name}`);
  let ok = false;
  try {
    ok = await fn();
  } catch (err) {
    process.stderr.write(`${err instanceof Error ? err.message : String(err)}\n`);
  }
  steps.push(`${ok ? 'ok  ' : 'FAIL'} ${name} (${((Date.now() - t) / 1000).toFixed(1)} s)`);
  return ok;
}

function check(ok) {
  if (ok) totals.passed += 1;
  else totals.failed += 1;
  return ok;
}

await ensureDeps(ROOT);
await ensureChromiumInstalled();
process.env.NEXT_TELEMETRY_DISABLED = '1';

// next-env.d.ts is written by the last build and may point at a build folder that is gone.
rmSync(path.join(ROOT, 'next-env.d.ts'), { force: true });
await step('typecheck (tsc)', async () => check((await runLive(bin('tsc'), ['--noEmit', '-p', '.'], { cwd: ROOT })) === 0));
await step('lint (eslint, Next.js config)', async () => check((await runLive(bin('eslint'), ['.', '--max-warnings=0'], { cwd: ROOT })) === 0));

let env;
const ready = await step('test database, build and start the app', async () => {
  const url = await prepareTestDatabase({ fresh: true });
  env = testEnv(url);
  buildTestApp(env);
  await startTestApp(env);
  return true;
});
if (!ready) totals.failed += 1;

if (ready) {
  const report = path.join(OUT, 'vitest.json');
  await step('vitest: unit, integration, end-to-end', async () => {
    const code = await runLive(bin('vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`], {
      cwd: ROOT,
      env: { ...process.env, ...env, NODE_ENV: 'test' },
    });
    if (!existsSync(report)) {
      totals.failed += 1;
      return false;
    }
    const r = JSON.parse(readFileSync(report, 'utf8'));
    totals.passed += r.numPassedTests;
    totals.failed += r.numFailedTests;
    totals.skipped += r.numPendingTests + (r.numTodoTests ?? 0);
    // A file that failed to load has no tests to count; count it as a failure.
    const brokenFiles = r.testResults.filter((f) => f.status === 'failed' && f.assertionResults.length === 0).length;
    totals.failed += brokenFiles;
    return code === 0;
  });
}

if (ready) {
  // The fault tier (docs/reliability.md → Faults): its own private cluster and ports, on the
  // build made above (about 2 minutes on a quiet 2-core machine).
  const report = path.join(OUT, 'faults.json');
  await step('faults: PostgreSQL restart, app killed, two instances, webhooks replayed', async () => {
    const code = await runLive(bin('vitest'), ['run', '--config', 'vitest.faults.config.mts', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`], {
      cwd: ROOT,
      env: { ...process.env, NODE_ENV: 'test', LOAD_DIST_DIR: TEST_DIST_DIR, LOAD_BUILD: 'skip' },
    });
    if (!existsSync(report)) {
      totals.failed += 1;
      return false;
    }
    const r = JSON.parse(readFileSync(report, 'utf8'));
    totals.passed += r.numPassedTests;
    totals.failed += r.numFailedTests + r.testResults.filter((f) => f.status === 'failed' && f.assertionResults.length === 0).length;
    return code === 0;
  });
}

stopAll();
process.stdout.write(`\n${steps.join('\n')}\nScreenshots and reports: ${path.relative(ROOT, OUT)}/ · total ${((Date.now() - t0) / 1000).toFixed(0)} s\n`);
process.stdout.write(`${totals.passed} passed, ${totals.failed} failed${totals.skipped ? `, ${totals.skipped} skipped` : ''}\n`);
setTimeout(() => process.exit(totals.failed > 0 ? 1 : 0), 300);
