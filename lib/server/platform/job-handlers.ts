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
import { runPooledFitJob } from '@/lib/server/analysis/pooled-fit';
import { purgeExpiredRespondents } from '@/lib/server/studies/retention';

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
  if (data.kind === 'pooled-fit') return runPooledFitJob(data as Parameters<typeof runPooledFitJob>[0], lastAttempt);
  if (data.kind === 'weber-plan') return runWeberPlanJob(data as Parameters<typeof runWeberPlanJob>[0], lastAttempt);
  throw new Error(`unknown job kind ${String(data.kind)}`);
}

/** Subscribes this process to every queue; one job at a time per queue (the machine is small). */
export async function startWorkers(log: (m: string) => void = () => {}) {
  const b = await boss('worker');
  await startMaintenance(b, log);
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

// Daily maintenance: the purge of respondents whose study closed longer ago than the retention
// it was launched with (lib/server/studies/retention.ts). Its own queue, so it never waits behind
// fits. Every worker offers the job at start and then hourly; pg-boss's singletonSeconds lets
// one job per 12 hours through across all workers (see PURGE_EVERY_SECONDS), so it runs at least
// daily even with several workers or after restarts. The purge is idempotent (a study is claimed by setting purged_at).
export const MAINTENANCE_QUEUE = 'maintenance';
// pg-boss refuses a throttle longer than its archive interval (12 h by default: "throttling
// interval cannot exceed archive interval"), so the purge is let through at most once per 12 h —
// at least daily, as the consent screen promises; a second run in a day only finds what expired since.
const PURGE_EVERY_SECONDS = 12 * 60 * 60;
export type MaintenanceKind = 'purge-respondents';

/** Runs one maintenance job (also called directly by tests). */
export function handleMaintenance(kind: MaintenanceKind): Promise<unknown> {
  if (kind === 'purge-respondents') return withRequestContext(() => purgeExpiredRespondents());
  throw new Error(`unknown maintenance job ${String(kind)}`);
}

/** Offers today's purge; a no-op when one was already sent within the day. */
export async function offerDailyPurge(b: PgBoss): Promise<void> {
  await b.send(MAINTENANCE_QUEUE, { kind: 'purge-respondents' }, { singletonKey: 'purge-respondents', singletonSeconds: PURGE_EVERY_SECONDS, retryLimit: 2, retryDelay: 60 });
}

async function startMaintenance(b: PgBoss, log: (m: string) => void) {
  if (!(await b.getQueue(MAINTENANCE_QUEUE))) {
    try {
      await b.createQueue(MAINTENANCE_QUEUE, { name: MAINTENANCE_QUEUE, policy: 'standard', retryLimit: 2, expireInSeconds: 60 * 60 });
    } catch (err) {
      if (!(await b.getQueue(MAINTENANCE_QUEUE))) throw err;
    }
  }
  await b.work<{ kind: MaintenanceKind }>(MAINTENANCE_QUEUE, { batchSize: 1, pollingIntervalSeconds: 30 }, async (jobs) => {
    for (const job of jobs) log(`maintenance/${job.data.kind} ${JSON.stringify(await handleMaintenance(job.data.kind))}`);
  });
  await offerDailyPurge(b);
  setInterval(() => void offerDailyPurge(b).catch((err) => console.error('[jobs] daily purge', err)), 60 * 60 * 1000).unref();
}
