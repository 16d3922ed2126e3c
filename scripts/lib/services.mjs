// Background processes (the app, the local stand-ins) started by `npm start` and the tests.
import { spawn } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import { ROOT } from './project.mjs';

const children = new Set();

/** Starts a long-running child; its output is prefixed with `name`. */
export function startService(name, cmd, args, { env = process.env, quiet = false } = {}) {
  // Own process group: `next start` forks a next-server child that a plain kill would orphan.
  const child = spawn(cmd, args, { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'], detached: true });
  const prefix = (chunk) => chunk.toString().split('\n').filter(Boolean).map((l) => `[${name}] ${l}\n`).join('');
  if (!quiet) {
    child.stdout.on('data', (c) => process.stdout.write(prefix(c)));
    child.stderr.on('data', (c) => process.stderr.write(prefix(c)));
  } else {
    child.stdout.resume();
    child.stderr.on('data', (c) => process.env.NOTCHWISE_VERBOSE && process.stderr.write(prefix(c)));
  }
  children.add(child);
  child.on('exit', () => children.delete(child));
  return child;
}

export function bin(name) {
  return path.join(ROOT, 'node_modules', '.bin', name);
}

/** Stops a service and everything it started (its process group). */
export function stopService(child, signal = 'SIGTERM') {
  try {
    process.kill(-child.pid, signal);
  } catch {
    child.kill(signal);
  }
}

export function stopAll(signal = 'SIGTERM') {
  for (const c of children) stopService(c, signal);
}

/** True when something already listens on the port. */
export function portInUse(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const s = net.connect({ host, port });
    s.once('connect', () => { s.destroy(); resolve(true); });
    s.once('error', () => resolve(false));
  });
}

// Whatever way this process ends, its services end with it.
process.on('exit', () => stopAll());

export function waitForPort(port, { host = '127.0.0.1', timeoutMs = 60_000 } = {}) {
  const until = Date.now() + timeoutMs;
  return new Promise((resolve, reject) => {
    const attempt = () => {
      const s = net.connect({ host, port });
      s.once('connect', () => { s.destroy(); resolve(); });
      s.once('error', () => {
        if (Date.now() > until) reject(new Error(`nothing listening on ${host}:${port} after ${timeoutMs} ms`));
        else setTimeout(attempt, 200);
      });
    };
    attempt();
  });
}

/** The local SMTP catcher (maildev) with its web inbox. */
export function startMailCatcher({ smtpPort, webPort, quiet }) {
  return startService('mail', bin('maildev'), ['--ip', '127.0.0.1', '--smtp', String(smtpPort), '--web', String(webPort), '--web-ip', '127.0.0.1', '--silent'], { quiet });
}

/** The local Stripe stand-in (scripts/fake-stripe): Checkout API, test checkout page, signed webhooks. */
export function startFakeStripe({ port, webhookUrl, webhookSecret, quiet, delayMs }) {
  const env = { ...process.env, FAKE_STRIPE_PORT: String(port), FAKE_STRIPE_WEBHOOK_URL: webhookUrl, STRIPE_WEBHOOK_SECRET: webhookSecret };
  if (delayMs !== undefined) env.FAKE_STRIPE_WEBHOOK_DELAY_MS = String(delayMs);
  return startService('stripe', bin('tsx'), ['scripts/fake-stripe/server.ts'], { env, quiet });
}
