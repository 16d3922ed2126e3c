// `npm run test:faults`: the fault tier (its own vitest config; a private PostgreSQL cluster under
// .data/faults that these tests stop and restart). Last line: `N passed, N failed`.
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { ROOT } from './lib/project.mjs';
import { runLive } from './lib/run.mjs';
import { bin } from './lib/services.mjs';

const out = path.join(ROOT, '.test-output');
mkdirSync(out, { recursive: true });
const report = path.join(out, 'faults.json');
const code = await runLive(bin('vitest'), ['run', '--config', 'vitest.faults.config.mts', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...process.argv.slice(2)], {
  cwd: ROOT,
  env: { ...process.env, NODE_ENV: 'test' },
});
let passed = 0;
let failed = code === 0 ? 0 : 1;
if (existsSync(report)) {
  const r = JSON.parse(readFileSync(report, 'utf8'));
  passed = r.numPassedTests;
  failed = r.numFailedTests + r.testResults.filter((f) => f.status === 'failed' && f.assertionResults.length === 0).length;
  if (code !== 0 && failed === 0) failed = 1;
}
process.stdout.write(`${passed} passed, ${failed} failed\n`);
process.exit(failed ? 1 : 0);
