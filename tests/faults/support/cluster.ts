// The fault tests' own PostgreSQL cluster (never the shared test cluster: these tests stop it).
import { spawn } from 'node:child_process';
import path from 'node:path';
import { DATA } from '../../../scripts/lib/project.mjs';

export const FAULTS_ROOT = path.join(DATA, 'faults');
export const FAULTS_PGPORT = Number(process.env.FAULTS_PGPORT ?? 54349);
const PG_BIN = process.env.PG_BIN ?? '/usr/lib/postgresql/15/bin';

/** pg_ctl as the postgres user, without blocking this process (respondents keep running). */
export function pgCtl(args: string[]): Promise<void> {
  const full = [path.join(PG_BIN, 'pg_ctl'), '-D', path.join(FAULTS_ROOT, 'pgdata'), ...args];
  const [cmd, argv] = process.getuid?.() === 0 ? ['runuser', ['-u', 'postgres', '--', ...full]] : [full[0], full.slice(1)];
  return new Promise((resolve, reject) => {
    const c = spawn(cmd, argv, { stdio: ['ignore', 'ignore', 'pipe'] });
    let err = '';
    c.stderr.on('data', (d) => (err += d));
    c.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`pg_ctl ${args.join(' ')} failed: ${err}`))));
  });
}

const opts = () => `-p ${FAULTS_PGPORT} -c listen_addresses=127.0.0.1 -k ${path.join(FAULTS_ROOT, 'pgsock')} -c max_connections=200 -c fsync=off`;
export const stopPostgres = () => pgCtl(['-m', 'fast', '-w', 'stop']);
export const startPostgres = () => pgCtl(['-l', path.join(FAULTS_ROOT, 'postgres.log'), '-w', '-t', '60', '-o', opts(), 'start']);
/** Fast shutdown (every connection cut), then start again. */
export const restartPostgres = () => pgCtl(['-m', 'fast', '-w', '-t', '60', '-o', opts(), 'restart']);
