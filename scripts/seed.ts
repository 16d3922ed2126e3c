// `npm run db:seed`: loads the demo data. Idempotent: running it again changes nothing.
import { orm } from '@/lib/server/db/orm';
import { seedAccounts } from './seed/accounts';
import { seedDemoPriceList } from './seed/demo-price-list';
import { seedDemoStudy } from './seed/demo-study';
import { seedDemoRecordStudies } from './seed/demo-record-studies';

async function main() {
  const o = await orm();
  try {
    const db = o.em.fork();
    const workspace = await seedAccounts(db);
    await seedDemoPriceList(db, workspace.id);
    await seedDemoStudy(db, workspace.id);
    await seedDemoRecordStudies(db, workspace.id);
    process.stdout.write(`[notchwise] demo data ready (workspace "${workspace.name}")\n`);
  } finally {
    await o.close(true);
  }
}

main().catch((err: unknown) => {
  process.stderr.write(`[notchwise] demo data failed: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
