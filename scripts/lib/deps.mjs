// Installs the npm dependencies when node_modules is missing or older than package-lock.json.
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { log, fail, runLive } from './run.mjs';

export async function ensureDeps(root) {
  const lock = path.join(root, 'package-lock.json');
  const marker = path.join(root, 'node_modules', '.notchwise-installed');
  const hash = createHash('sha256').update(readFileSync(lock)).digest('hex');
  if (existsSync(marker) && readFileSync(marker, 'utf8') === hash) return;
  log('installing npm dependencies (npm ci) ...');
  const code = await runLive('npm', ['ci', '--no-audit', '--no-fund', '--loglevel=error'], { cwd: root });
  if (code !== 0) fail('npm ci failed.', 'Check that the npm registry is reachable, then run `npm start` again.');
  writeFileSync(marker, hash);
}
