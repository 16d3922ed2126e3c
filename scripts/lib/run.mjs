// Small process helpers shared by the start, test and stop scripts.
import { spawn, spawnSync } from 'node:child_process';

export function log(msg) {
  process.stdout.write(`[notchwise] ${msg}\n`);
}

export function fail(msg, hint) {
  process.stderr.write(`\n[notchwise] ${msg}\n${hint ? `  → ${hint}\n` : ''}\n`);
  process.exit(1);
}

/** Runs a command to completion; returns { code, stdout, stderr }. */
export function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { encoding: 'utf8', ...opts });
  return { code: r.status ?? 1, stdout: r.stdout ?? '', stderr: r.stderr ?? '', error: r.error };
}

/** Runs a command with inherited output; resolves with its exit code. */
export function runLive(cmd, args, opts = {}) {
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { stdio: 'inherit', ...opts });
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
    child.on('error', () => resolve(1));
  });
}

export function isRoot() {
  return typeof process.getuid === 'function' && process.getuid() === 0;
}
