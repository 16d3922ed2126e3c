import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import type pg from 'pg';
import { trialsPerRespondent } from '@/lib/schemas/study.schema';
import { startApp, stopApp } from '../../scripts/load/app';
import { request } from '../../scripts/load/respondent-client';
import { createLoadStudy, loadDesign, type LoadStudy } from '../../scripts/load/study';
import { crowd, expectNothingLost, faultsPool } from './support/respondents';

const bases = inject('appPorts').map((p) => `http://127.0.0.1:${p}`);

describe('two `next start` instances against one database, respondents alternating between them per request', () => {
  let apps: ChildProcess[] = [];
  let pool: pg.Pool;
  let study: LoadStudy;
  beforeAll(async () => {
    // The same environment (one AUTH_SECRET, one DATABASE_URL) on both, as behind a load balancer.
    apps = await Promise.all(inject('appPorts').map((p) => startApp(inject('faultsEnv'), p)));
    pool = faultsPool();
    study = await createLoadStudy(pool, { design: loadDesign(1), seats: 300, name: 'Faults: two instances (simulated)' });
  });
  afterAll(async () => {
    await pool?.end();
    await Promise.all(apps.map((a) => stopApp(a)));
  });

  it('stores every answer once and uses one seat per complete', async () => {
    const { stats, done } = crowd(study, bases);
    const { failures } = await done;
    await expectNothingLost(pool, study, stats, failures, { respondents: 200, trialsEach: trialsPerRespondent(study.design).total });
  });

  it('a retry that lands on the other instance is the same answer, and a close is seen by both at once', async () => {
    const [a, b] = bases;
    const api = `/api/r/${study.linkToken}`;
    const s = (await request(a, 'POST', `${api}/start`, { consent: true, segmentAnswers: { household: '1' } })).body as { resumeToken: string; upcoming: { idx: number; kind: string }[] };
    const h = { 'x-resume-token': s.resumeToken };
    const first = { clientId: randomUUID(), idx: 0, answer: 1, responseMs: 700 };
    expect((await request(a, 'POST', `${api}/answer`, first, h)).status).toBe(200);
    // Both instances now hold this respondent in their plan cache.
    expect((await request(b, 'POST', `${api}/answer`, first, h)).status).toBe(200);
    expect((await request(b, 'POST', `${api}/answer`, { ...first, clientId: randomUUID() }, h)).status).toBe(409);
    expect((await request(b, 'POST', `${api}/answer`, { clientId: randomUUID(), idx: 1, answer: 1, responseMs: 700 }, h)).status).toBe(200);
    const stored = await pool.query('select idx from trial t join respondent r on r.id = t.respondent_id where r.resume_token = $1 order by idx', [s.resumeToken]);
    expect(stored.rows.map((r) => r.idx)).toEqual([0, 1]);

    await pool.query(`update study set state = 'closed', closed_at = now() where id = $1`, [study.studyId]);
    for (const base of bases) {
      const r = await request(base, 'POST', `${api}/answer`, { clientId: randomUUID(), idx: 2, answer: 1, responseMs: 700 }, h);
      expect(r.status).toBe(410);
      expect((await request(base, 'POST', `${api}/complete`, {}, h)).status).toBe(410);
      expect((await request(base, 'POST', `${api}/start`, { consent: true, segmentAnswers: { household: '1' } })).status).toBe(410);
    }
  });
});
