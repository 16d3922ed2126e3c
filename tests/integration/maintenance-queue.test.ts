// Protects the daily purge's schedule (issue 13, point 5): the worker offers the purge job to
// pg-boss at start, and pg-boss must accept the throttle we ask for — a throttle longer than its
// archive interval made the worker refuse to start, so no fit ran anywhere.
import { afterAll, describe, expect, it } from 'vitest';
import { boss, stopBoss } from '@/lib/server/platform/jobs';
import { MAINTENANCE_QUEUE, offerDailyPurge } from '@/lib/server/platform/job-handlers';

describe('the daily purge on the job queue', () => {
  afterAll(() => stopBoss());

  it('is accepted by pg-boss and offered once per throttle window, however often a worker offers it', async () => {
    const b = await boss('worker');
    if (!(await b.getQueue(MAINTENANCE_QUEUE))) await b.createQueue(MAINTENANCE_QUEUE, { name: MAINTENANCE_QUEUE, policy: 'standard' });
    await offerDailyPurge(b);
    await offerDailyPurge(b);
    const jobs = await b.fetch(MAINTENANCE_QUEUE, { batchSize: 10 });
    expect(jobs?.length ?? 0).toBe(1);
  });
});
