import 'server-only';
import type PgBoss from 'pg-boss';
import type { JobData } from '@/lib/server/analysis/cache';
import { runFitJob } from '@/lib/server/analysis/study-fit';
import { boss, MAIL_QUEUE, type QueueName } from './jobs';
import { runAccountMailJob, type AccountMailJob } from '@/lib/server/team/account-mail';
import { withRequestContext } from '@/lib/server/db/orm';
import { runPlannerJob } from '@/lib/server/analysis/planner';
import { runSegmentsJob } from '@/lib/server/analysis/segments';
import { runWeberPlanJob } from '@/lib/server/analysis/weber-plan';

// What the worker runs for each job kind; one place, so tests can call a handler directly.

/** Runs one job with its own request-scoped EntityManager. */
export function handleJob(data: JobData, lastAttempt: boolean): Promise<void> {
  return withRequestContext(() => runJob(data, lastAttempt));
}

async function runJob(data: JobData, lastAttempt: boolean): Promise<void> {
  if (data.kind === 'fit') return runFitJob(data as Parameters<typeof runFitJob>[0], lastAttempt);
  if (data.kind === 'segments') return runSegmentsJob(data as Parameters<typeof runSegmentsJob>[0], lastAttempt);
  if (data.kind === 'account-mail') return runAccountMailJob(data as unknown as AccountMailJob);
  if (data.kind === 'planner') return runPlannerJob(data as Parameters<typeof runPlannerJob>[0], lastAttempt);
  if (data.kind === 'weber-plan') return runWeberPlanJob(data as Parameters<typeof runWeberPlanJob>[0], lastAttempt);
  throw new Error(`unknown job kind ${String(data.kind)}`);
}

/** Subscribes this process to every queue; one job at a time per queue (the machine is small). */
export async function startWorkers(log: (m: string) => void = () => {}) {
  const b = await boss('worker');
  for (const queue of ['analysis', 'planner'] as QueueName[]) {
    await b.work<JobData>(queue, { includeMetadata: true, batchSize: 1, pollingIntervalSeconds: 1 }, async (jobs: PgBoss.JobWithMetadata<JobData>[]) => {
      for (const job of jobs) {
        const t0 = Date.now();
        await handleJob(job.data, job.retryCount >= job.retryLimit);
        log(`${queue}/${job.data.kind} ${job.data.studyId.slice(0, 8)} done in ${Date.now() - t0} ms`);
      }
    });
  }
  // Account e-mails: the relay failing throws, and pg-boss retries with a growing delay.
  await b.work<AccountMailJob>(MAIL_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async (jobs) => {
    for (const job of jobs) {
      await withRequestContext(() => runAccountMailJob(job.data));
      log(`${MAIL_QUEUE}/${job.data.mail} sent`);
    }
  });
  return b;
}
