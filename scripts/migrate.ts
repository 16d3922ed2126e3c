// Applies the committed migrations (npm run db:migrate). The schema is never created any other way.
import { MikroORM } from '@mikro-orm/postgresql';
import config from '../mikro-orm.config';

async function main() {
  const orm = await MikroORM.init({ ...config, allowGlobalContext: true });
  try {
    const applied = await orm.getMigrator().up();
    process.stdout.write(`[notchwise] migrations: ${applied.length ? applied.map((m) => m.name).join(', ') + ' applied' : 'up to date'}\n`);
  } finally {
    await orm.close(true);
  }
}

main().catch((err: unknown) => {
  const e = err as { code?: string; message?: string };
  const reason = e.code === 'ECONNREFUSED' ? 'the database is not reachable (is it running? `npm start` starts it)' : (e.message ?? String(err));
  process.stderr.write(`[notchwise] migrations failed: ${reason}\n`);
  process.exit(1);
});
