// Installs Debian packages the project needs (PostgreSQL 15, Chromium) when they are missing.
import { existsSync } from 'node:fs';
import { isRoot, log, fail, run, runLive } from './run.mjs';

let updated = false;

export async function aptInstall(pkgs, why) {
  const sudo = isRoot() ? [] : ['sudo', '-n'];
  const cmd = (args) => (sudo.length ? ['sudo', ['-n', ...args]] : [args[0], args.slice(1)]);
  log(`installing ${pkgs.join(', ')} from Debian's packages (${why}) ...`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!updated) {
    const [c, a] = cmd(['apt-get', 'update', '-qq']);
    if ((await runLive(c, a, { env })) !== 0) fail('apt-get update failed.', 'Check the network access to the Debian mirrors, or install the packages by hand: apt-get install ' + pkgs.join(' '));
    updated = true;
  }
  const [c, a] = cmd(['apt-get', 'install', '-y', '-qq', '--no-install-recommends', ...pkgs]);
  if ((await runLive(c, a, { env })) !== 0) fail(`apt-get install ${pkgs.join(' ')} failed.`, 'Run it by hand as root and try again.');
}

export const PG_BIN = process.env.PG_BIN ?? '/usr/lib/postgresql/15/bin';

export async function ensurePostgresInstalled() {
  if (existsSync(`${PG_BIN}/pg_ctl`) && existsSync(`${PG_BIN}/initdb`)) return;
  await aptInstall(['postgresql-15'], 'the private database server');
  if (!existsSync(`${PG_BIN}/pg_ctl`)) fail(`PostgreSQL server binaries are still missing in ${PG_BIN}.`, 'Set PG_BIN to the folder holding pg_ctl and initdb.');
}

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export async function ensureChromiumInstalled() {
  if (existsSync(CHROMIUM)) return CHROMIUM;
  await aptInstall(['chromium'], 'the browser for end-to-end tests');
  if (!existsSync(CHROMIUM)) fail(`Chromium is still missing at ${CHROMIUM}.`, 'Set CHROMIUM_PATH to its executable.');
  return CHROMIUM;
}

export function which(bin) {
  return run('sh', ['-c', `command -v ${bin}`]).stdout.trim();
}
