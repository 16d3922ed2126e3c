// A private PostgreSQL cluster for this checkout: data under .data/, loopback only, own port.
import { existsSync, mkdirSync, readFileSync, chmodSync } from 'node:fs';
import path from 'node:path';
import net from 'node:net';
import { ensurePostgresInstalled, PG_BIN } from './system-packages.mjs';
import { isRoot, log, fail, run } from './run.mjs';

const PG_USER = 'postgres';

function asPg(bin, args) {
  const full = path.join(PG_BIN, bin);
  return isRoot() ? run('runuser', ['-u', PG_USER, '--', full, ...args]) : run(full, args);
}

function chownToPg(dir) {
  if (isRoot()) run('chown', ['-R', `${PG_USER}:${PG_USER}`, dir]);
}

/** The postgres user must be able to enter every parent folder of the data folder. */
function ensureTraversable(dir) {
  if (!isRoot()) return;
  let d = path.dirname(dir);
  while (d !== path.dirname(d)) {
    if (run('runuser', ['-u', PG_USER, '--', 'test', '-x', d]).code !== 0) {
      run('chmod', ['o+x', d]);
    }
    d = path.dirname(d);
  }
}

function portOpen(port) {
  return new Promise((resolve) => {
    const s = net.connect({ host: '127.0.0.1', port });
    s.once('connect', () => { s.destroy(); resolve(true); });
    s.once('error', () => resolve(false));
  });
}

/**
 * Makes sure the cluster in `root` exists and runs on `port`, and that `database` exists.
 * Returns the connection URL.
 */
export async function ensureCluster({ root, port, database }) {
  await ensurePostgresInstalled();
  const dataDir = path.join(root, 'pgdata');
  const sockDir = path.join(root, 'pgsock');
  const logFile = path.join(root, 'postgres.log');
  mkdirSync(root, { recursive: true });
  mkdirSync(sockDir, { recursive: true });
  ensureTraversable(dataDir);
  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) {
    mkdirSync(dataDir, { recursive: true });
    chownToPg(root);
    chmodSync(dataDir, 0o700);
    log(`creating a private PostgreSQL cluster in ${path.relative(process.cwd(), dataDir) || dataDir}`);
    const r = asPg('initdb', ['-D', dataDir, '-U', PG_USER, '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    if (r.code !== 0) fail('initdb failed:\n' + r.stderr.trim(), `Remove ${dataDir} and run again.`);
  }
  chownToPg(root);
  const status = asPg('pg_ctl', ['-D', dataDir, 'status']);
  if (status.code !== 0) {
    if (await portOpen(port)) {
      fail(`Port ${port} on 127.0.0.1 is taken by another program, not this project's database.`, 'Stop that program, or choose another port with PGPORT=... .');
    }
    const opts = `-p ${port} -c listen_addresses=127.0.0.1 -k ${sockDir} -c max_connections=200 -c fsync=${process.env.PG_FSYNC ?? 'on'}`;
    const r = asPg('pg_ctl', ['-D', dataDir, '-l', logFile, '-w', '-t', '60', '-o', opts, 'start']);
    if (r.code !== 0) {
      const tail = existsSync(logFile) ? readFileSync(logFile, 'utf8').split('\n').slice(-8).join('\n') : r.stderr;
      fail('PostgreSQL did not start:\n' + tail, `See ${logFile}.`);
    }
  }
  const exists = asPg('psql', ['-h', '127.0.0.1', '-p', String(port), '-U', PG_USER, '-d', 'postgres', '-tAc', `SELECT 1 FROM pg_database WHERE datname='${database}'`]);
  if (exists.code !== 0) fail('Cannot reach the project database:\n' + exists.stderr.trim(), `Check ${logFile}; "npm run stop" then start again.`);
  if (exists.stdout.trim() !== '1') {
    const c = asPg('createdb', ['-h', '127.0.0.1', '-p', String(port), '-U', PG_USER, database]);
    if (c.code !== 0) fail('createdb failed:\n' + c.stderr.trim());
  }
  return `postgresql://${PG_USER}@127.0.0.1:${port}/${database}`;
}

export function stopCluster({ root, mode = 'fast' }) {
  const dataDir = path.join(root, 'pgdata');
  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) return false;
  if (asPg('pg_ctl', ['-D', dataDir, 'status']).code !== 0) return false;
  const r = asPg('pg_ctl', ['-D', dataDir, '-m', mode, '-w', 'stop']);
  return r.code === 0;
}

export function restartCluster({ root }) {
  const dataDir = path.join(root, 'pgdata');
  return asPg('pg_ctl', ['-D', dataDir, '-m', 'fast', '-w', 'restart']).code === 0;
}

export function dropDatabase({ port, database }) {
  return asPg('dropdb', ['-h', '127.0.0.1', '-p', String(port), '-U', PG_USER, '--if-exists', '--force', database]).code === 0;
}

export function createDatabase({ port, database }) {
  return asPg('createdb', ['-h', '127.0.0.1', '-p', String(port), '-U', PG_USER, database]).code === 0;
}

