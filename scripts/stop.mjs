// `npm run stop`: stops this checkout's private PostgreSQL clusters.
import path from 'node:path';
import { stopCluster } from './lib/postgres.mjs';
import { DATA } from './lib/project.mjs';
import { log } from './lib/run.mjs';

for (const name of ['dev', 'test']) {
  if (stopCluster({ root: path.join(DATA, name) })) log(`stopped the ${name} database`);
}
log('done');
