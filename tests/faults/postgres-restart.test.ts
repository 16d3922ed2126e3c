import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { ChildProcess } from 'node:child_process';
import type { Page } from 'playwright-core';
import type pg from 'pg';
import { trialsPerRespondent } from '@/lib/schemas/study.schema';
import { startApp, stopApp } from '../../scripts/load/app';
import { createLoadStudy, loadDesign, type LoadStudy } from '../../scripts/load/study';
import { openBrowser, screenshot } from '../support/browser';
import { answerNext } from '../support/respondent-walk';
import { startPostgres, stopPostgres } from './support/cluster';
import { crowd, expectNothingLost, faultsPool, sleep, until, watchBalance } from './support/respondents';
import { completedEvent, deliverUntilAccepted, pendingPurchase } from './support/webhooks';

const base = `http://127.0.0.1:${inject('appPorts')[0]}`;

/** Answers the trial on screen (the phone respondent): "Left", or "Often" for the attention check. */
async function answerOne(page: Page): Promise<'answered' | 'thanks'> {
  return (await answerNext(page, 60_000)) === 'end' ? 'thanks' : 'answered';
}

describe('PostgreSQL stopped (fast shutdown) and started again while 200 respondents and a phone answer', () => {
  let app: ChildProcess;
  let pool: pg.Pool;
  let study: LoadStudy;
  beforeAll(async () => {
    app = await startApp(inject('faultsEnv'), inject('appPorts')[0]);
    pool = faultsPool();
    study = await createLoadStudy(pool, { design: loadDesign(1), seats: 400, name: 'Faults: database restart (simulated)' });
  });
  afterAll(async () => {
    await startPostgres().catch(() => {}); // already running unless the test failed midway
    await pool?.end();
    if (app) await stopApp(app);
  });

  it('loses nothing, stores nothing twice, and the phone shows "Reconnecting" and then carries on', async () => {
    const { context, page } = await openBrowser({ phone: true });
    try {
      await page.goto(`${base}/r/${study.linkToken}`);
      await page.getByRole('button', { name: 'I agree, start' }).click();
      await page.getByRole('button', { name: '2', exact: true }).click();
      for (let i = 0; i < 3; i++) await answerOne(page);

      const lowest = watchBalance(pool, study.workspaceId);
      const { stats, done } = crowd(study, [base]);
      await until(() => stats.answersAcked >= 1000, 120_000, '1,000 answers before the restart');
      await stopPostgres();
      const ackedAtStop = stats.answersAcked;
      // The phone answers on; its answer cannot be stored, so the page says it is reconnecting.
      await answerOne(page);
      await page.getByTestId('reconnecting').waitFor({ timeout: 20_000 });
      expect(await page.getByTestId('reconnecting').textContent()).toContain('Reconnecting');
      await screenshot(page, 'faults-phone-reconnecting');
      await sleep(2000);
      await startPostgres();

      await page.getByTestId('reconnecting').waitFor({ state: 'hidden', timeout: 40_000 });
      let answered = 4;
      while ((await answerOne(page)) === 'answered') answered++;
      await page.getByTestId('thanks').waitFor();

      const { failures } = await done;
      expect(stats.retries).toBeGreaterThan(0);
      expect(ackedAtStop).toBeLessThan(stats.answersAcked);
      const f = await expectNothingLost(pool, study, stats, failures, {
        respondents: 200, trialsEach: trialsPerRespondent(study.design).total, extraAnswers: answered, extraCompletes: 1,
      });
      expect(answered).toBe(trialsPerRespondent(study.design).total);
      expect(await lowest()).toBeGreaterThanOrEqual(0);
      process.stdout.write(`[faults] database restart: ${stats.answersAcked} answers acknowledged (${ackedAtStop} before the stop), ${stats.retries} retries, ${f.trials} trials stored, ${f.completes} completes = ${f.seatsUsed} seats used, errors seen ${JSON.stringify(stats.errors)}\n`);
    } finally {
      await context.close();
    }
  });
});

describe('Stripe webhooks delivered twice, out of order and concurrently while PostgreSQL restarts', () => {
  let app: ChildProcess;
  let pool: pg.Pool;
  beforeAll(async () => {
    app = await startApp(inject('faultsEnv'), inject('appPorts')[0]);
    pool = faultsPool();
  });
  afterAll(async () => {
    await startPostgres().catch(() => {});
    await pool?.end();
    if (app) await stopApp(app);
  });

  it('credits each paid session exactly once', async () => {
    const ws = await createLoadStudy(pool, { seats: 25, name: 'Faults: webhooks (simulated)' });
    const s1 = await pendingPurchase(pool, ws.workspaceId, 100);
    const s2 = await pendingPurchase(pool, ws.workspaceId, 400);
    const first = completedEvent(s1, ws.workspaceId);
    // A second, later event about the same session, delivered before the first one.
    const later = completedEvent(s1, ws.workspaceId);
    const other = completedEvent(s2, ws.workspaceId);
    const ignored = completedEvent(s2, ws.workspaceId, 'checkout.session.expired');

    await stopPostgres();
    const deliveries = Promise.all([
      deliverUntilAccepted(base, later), deliverUntilAccepted(base, ignored),
      deliverUntilAccepted(base, first), deliverUntilAccepted(base, first), deliverUntilAccepted(base, first),
      deliverUntilAccepted(base, other), deliverUntilAccepted(base, other),
    ]);
    await sleep(1500);
    await startPostgres();
    const outcomes = await deliveries;
    // And once more each, after the database is back: Stripe's own late retries.
    outcomes.push(await deliverUntilAccepted(base, first), await deliverUntilAccepted(base, later), await deliverUntilAccepted(base, other));

    expect(outcomes.filter((o) => o === 'credited')).toHaveLength(2);
    expect(outcomes.filter((o) => o === 'ignored')).toHaveLength(1);
    const ledger = await pool.query(`select reference, delta from seat_ledger_entry where workspace_id = $1 and reason = 'purchase' order by delta`, [ws.workspaceId]);
    expect(ledger.rows).toEqual([{ reference: s1, delta: 100 }, { reference: s2, delta: 400 }]);
    const balance = await pool.query('select sum(delta)::int as b from seat_ledger_entry where workspace_id = $1', [ws.workspaceId]);
    expect(balance.rows[0].b).toBe(25 + 100 + 400);
    const paid = await pool.query(`select count(*)::int as n from purchase where workspace_id = $1 and status = 'paid'`, [ws.workspaceId]);
    expect(paid.rows[0].n).toBe(2);
    process.stdout.write(`[faults] webhooks: ${outcomes.length} deliveries accepted (${outcomes.join(', ')}); 2 sessions credited once each\n`);
  });
});
