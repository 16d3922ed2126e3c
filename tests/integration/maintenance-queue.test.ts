// Protects the daily purge's schedule (issue 13, point 5): the worker offers the purge job to
// pg-boss at start, and pg-boss must accept the throttle we ask for — a throttle longer than its
// archive interval made the worker refuse to start, so no fit ran anywhere.
import { afterAll, describe, expect, it } from 'vitest';
import { boss, stopBoss } from '@/lib/server/platform/jobs';
import { em } from '@/lib/server/db/orm';
import { sqlOne } from '@/lib/server/db/sql';
import { MAINTENANCE_QUEUE, offerDailyPurge } from '@/lib/server/platform/job-handlers';

describe('the daily purge on the job queue', () => {
  afterAll(() => stopBoss());

  it('is accepted by pg-boss and offered once per throttle window, however often a worker offers it', async () => {
    const b = await boss('worker');
    if (!(await b.getQueue(MAINTENANCE_QUEUE))) await b.createQueue(MAINTENANCE_QUEUE, { name: MAINTENANCE_QUEUE, policy: 'standard' });
    await offerDailyPurge(b);
    await offerDailyPurge(b);
    // Counted in pg-boss's table, whatever its state: under `npm test` the test app's own worker
    // offered (and may already have run) the same job against this database.
    const row = await sqlOne<{ n: number }>(await em(), `select count(*)::int as n from pgboss.job where name = ? and singleton_key = 'purge-respondents'`, [MAINTENANCE_QUEUE]);
    expect(row?.n).toBe(1);
  });
});
