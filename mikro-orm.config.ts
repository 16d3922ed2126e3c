import { defineConfig } from '@mikro-orm/postgresql';
import { Migrator } from '@mikro-orm/migrations';
import * as entities from './entities/index';

// DATABASE_URL is read here directly because the MikroORM CLI loads this file outside the app;
// the app itself passes its parsed env (lib/server/env.ts) through `clientUrl`.
export default defineConfig({
  clientUrl: process.env.DATABASE_URL ?? 'postgresql://postgres@127.0.0.1:54329/notchwise',
  entities: Object.values(entities),
  extensions: [Migrator],
  migrations: {
    path: './migrations',
    pathTs: './migrations',
    glob: '!(*.d).{js,ts}',
    transactional: true,
    allOrNothing: true,
    snapshot: false,
    emit: 'ts',
  },
  pool: { min: 0, max: Number(process.env.DB_POOL_MAX ?? 10) },
  debug: false,
  allowGlobalContext: false,
});
