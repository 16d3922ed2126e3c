// The job worker (`tsx --conditions=react-server scripts/worker.ts`): fits, segment comparisons
// and planner runs from the pg-boss queues. Run several for more throughput; a job whose worker
// dies expires and is retried by another, so a restart loses nothing.
import { orm } from '@/lib/server/db/orm';
import { startWorkers } from '@/lib/server/platform/job-handlers';
import { stopBoss } from '@/lib/server/platform/jobs';

const log = (m: string) => process.stdout.write(`[worker] ${m}\n`);

async function main() {
  await startWorkers(log);
  log('listening on queues analysis, planner, mail');
  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    log('stopping');
    await stopBoss().catch(() => {});
    await (await orm()).close(true).catch(() => {});
    process.exit(0);
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((err: unknown) => {
  process.stderr.write(`[worker] failed to start: ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
