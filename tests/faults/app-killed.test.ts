import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { ChildProcess } from 'node:child_process';
import type pg from 'pg';
import { trialsPerRespondent } from '@/lib/schemas/study.schema';
import { startApp, stopApp } from '../../scripts/load/app';
import { createLoadStudy, loadDesign, type LoadStudy } from '../../scripts/load/study';
import { crowd, expectNothingLost, faultsPool, sleep, until, watchBalance } from './support/respondents';

const port = inject('appPorts')[0];
const base = `http://127.0.0.1:${port}`;

describe('the app process killed (SIGKILL of next-server and its parent) and started again mid-run', () => {
  let app: ChildProcess;
  let pool: pg.Pool;
  let study: LoadStudy;
  beforeAll(async () => {
    app = await startApp(inject('faultsEnv'), port);
    pool = faultsPool();
    study = await createLoadStudy(pool, { design: loadDesign(1), seats: 400, name: 'Faults: app killed (simulated)' });
  });
  afterAll(async () => {
    await pool?.end();
    if (app) await stopApp(app);
  });

  it('every acknowledged answer stored once, a seat per complete, the balance never below zero', async () => {
    const lowest = watchBalance(pool, study.workspaceId);
    const { stats, done } = crowd(study, [base]);
    await until(() => stats.answersAcked >= 1000, 120_000, '1,000 answers before the kill');
    await stopApp(app, 'SIGKILL');
    const ackedAtKill = stats.answersAcked;
    await sleep(1000);
    app = await startApp(inject('faultsEnv'), port);
    const { failures } = await done;
    expect(ackedAtKill).toBeLessThan(stats.answersAcked);
    expect(stats.retries).toBeGreaterThan(0);
    const f = await expectNothingLost(pool, study, stats, failures, { respondents: 200, trialsEach: trialsPerRespondent(study.design).total });
    expect(await lowest()).toBeGreaterThanOrEqual(0);
    process.stdout.write(`[faults] app killed: ${stats.answersAcked} answers acknowledged (${ackedAtKill} before the kill), ${stats.retries} retries, ${f.trials} stored, ${f.respondents} respondents started (a start whose reply was lost is an abandoned respondent), ${f.completes} completes = ${f.seatsUsed} seats used\n`);
  });
});
