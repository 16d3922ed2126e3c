// Paths, ports and the environment shared by the start, test and stop scripts.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
export const DATA = path.join(ROOT, '.data');
/**
 * `vite build` arguments for the respondent bundle (its config: respondent/vite.config.ts). The
 * runner loader reads the TypeScript config as ESM in this CommonJS package without a warning.
 */
export const RESPONDENT_BUILD_ARGS = ['build', '-c', 'respondent/vite.config.ts', '--configLoader', 'runner'];

export function intFromEnv(name, fallback) {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n <= 0 || n > 65535) {
    process.stderr.write(`[notchwise] ${name}=${raw} is not a port number (1-65535).\n`);
    process.exit(1);
  }
  return n;
}

/** A secret kept in .data so sessions survive restarts; generated on first use. */
export function persistentSecret(name) {
  mkdirSync(DATA, { recursive: true });
  const file = path.join(DATA, name);
  if (!existsSync(file)) writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600 });
  return readFileSync(file, 'utf8').trim();
}

export const DEMO_PASSWORD = 'harbour-demo-2026';
export const DEMO_ACCOUNTS = [
  { email: 'owner@harbourline.example', role: 'owner', name: 'Mira Castell' },
  { email: 'analyst@harbourline.example', role: 'analyst', name: 'Tomas Reyne' },
  { email: 'viewer@harbourline.example', role: 'viewer', name: 'Ines Valko' },
];
