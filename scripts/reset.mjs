// `npm run db:reset`: drops the demo database and loads it afresh (migrations + demo data).
import path from 'node:path';
import { ensureCluster, dropDatabase } from './lib/postgres.mjs';
import { DATA, ROOT, intFromEnv, persistentSecret } from './lib/project.mjs';
import { fail, log, runLive } from './lib/run.mjs';
import { bin } from './lib/services.mjs';

const PGPORT = intFromEnv('PGPORT', 54329);
const root = path.join(DATA, 'dev');
await ensureCluster({ root, port: PGPORT, database: 'postgres' });
dropDatabase({ port: PGPORT, database: 'notchwise' });
const DATABASE_URL = await ensureCluster({ root, port: PGPORT, database: 'notchwise' });
const env = { ...process.env, DATABASE_URL, AUTH_SECRET: persistentSecret('auth-secret') };
if ((await runLive(bin('tsx'), ['scripts/migrate.ts'], { cwd: ROOT, env })) !== 0) fail('migrations failed');
if ((await runLive(bin('tsx'), ['--conditions=react-server', 'scripts/seed.ts'], { cwd: ROOT, env })) !== 0) fail('demo data failed');
log('the demo database was reset');
